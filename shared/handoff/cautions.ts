/**
 * The cautions Matchloom shows near the power and stress figures and in the hand-off report
 * (PRODUCT.md, "Cautions the product shows").
 */
export const HANDOFF_CAUTIONS: readonly string[] = Object.freeze([
  'RF exposure limits apply to transmitters and antennas and depend on power, frequency and distance.',
  'Matching-network parts can see high voltages and currents at transmit power: check part voltage and current ratings with margin.',
  'Emissions and spectrum use are regulated.',
  'Results are engineering estimates from ideal or simple models: verify with measurement, and defer to local regulations and licensed practice.',
]);
