/** The cautions PRODUCT.md asks for beside power and stress figures. */
export const TRANSMIT_CAUTIONS = [
  'RF exposure limits apply to transmitters and antennas and depend on power, frequency and distance.',
  'Matching-network parts can see high voltages and currents at transmit power: check each part’s voltage and current ratings, with margin.',
  'Emissions and spectrum use are regulated.',
  'These are engineering estimates from ideal or simple models: verify by measurement, and defer to local regulations and licensed practice.',
] as const;

export function TransmitCautions() {
  return (
    <aside aria-label="Cautions for transmitting designs" className="rounded-md border border-amber/50 bg-amber-soft/60 px-3 py-2 text-xs text-amber-deep">
      <p className="mb-1 font-bold">Before you transmit</p>
      <ul className="list-disc space-y-0.5 pl-4">
        {TRANSMIT_CAUTIONS.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    </aside>
  );
}
