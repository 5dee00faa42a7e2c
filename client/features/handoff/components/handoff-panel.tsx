/**
 * FOR THE WORKSPACE: `<HandoffPanel roomId />` — the hand-off pack (one zip) and each of its files on
 * its own, with the cautions the product shows beside transmit figures. Any member may download.
 */
import { useId, useState } from 'react';
import { HANDOFF_CAUTIONS } from '../../../../shared/handoff/cautions';
import { controlClass } from '../../../components/form-field';
import { cx } from '../../../lib/cx';
import { BOM_SERIES, exportHref, fetchExport, saveFile, type BomSeries, type HandoffTarget } from '../api/download-export';

const FILES: { target: HandoffTarget; title: string; detail: string }[] = [
  { target: 'bom.csv', title: 'Bill of materials (CSV)', detail: 'Each lumped part with its exact and nearest preferred value, tolerance, Q and the peak voltage and current at the drive power.' },
  { target: 'lines.csv', title: 'Line dimensions (CSV)', detail: 'Each line section and stub: Z0, electrical length, and width and length on the room’s substrate.' },
  { target: 'network.s2p', title: 'Network S-parameters (.s2p)', detail: 'The chain alone across the sweep, port 1 at the port, port 2 at the load.' },
  { target: 'matched-input.s1p', title: 'Matched input (.s1p)', detail: 'The reflection at the port with the load in place.' },
  { target: 'design.matchloom.json', title: 'Design file (.matchloom.json)', detail: 'The whole design; import it as a new room.' },
  { target: 'report.pdf', title: 'Report (PDF)', detail: 'Figures, charts, parts, notes and the cautions, for review.' },
];

export function Cautions({ className }: { className?: string }) {
  return (
    <aside aria-label="Cautions" className={cx('rounded-xl border border-amber/60 bg-amber-soft/60 p-4 text-sm', className)}>
      <h3 className="mb-2 font-extrabold text-amber-deep">Before this leaves the room</h3>
      <ul className="flex list-disc flex-col gap-1.5 pl-5 text-ink">
        {HANDOFF_CAUTIONS.map((caution) => (
          <li key={caution}>{caution}</li>
        ))}
      </ul>
    </aside>
  );
}

export function HandoffPanel({ roomId }: { roomId: string }) {
  const id = useId();
  const [series, setSeries] = useState<BomSeries | ''>('');
  const [busy, setBusy] = useState<HandoffTarget | null>(null);
  const [error, setError] = useState<{ target: HandoffTarget; message: string } | null>(null);

  const download = async (target: HandoffTarget) => {
    setBusy(target);
    setError(null);
    try {
      saveFile(await fetchExport(exportHref(roomId, target, series || undefined), target));
    } catch (e) {
      setError({ target, message: e instanceof Error ? e.message : 'The download failed.' });
    } finally {
      setBusy(null);
    }
  };

  const link = (target: HandoffTarget, label: string, primary = false) => (
    <a
      href={exportHref(roomId, target, series || undefined)}
      download
      aria-busy={busy === target || undefined}
      onClick={(event) => {
        event.preventDefault();
        void download(target);
      }}
      className={cx(
        'inline-flex items-center justify-center rounded-lg px-3 py-1.5 text-sm font-semibold',
        primary ? 'bg-ink text-paper hover:bg-ink-soft' : 'border border-rule bg-card text-ink hover:border-ink-faint',
      )}
    >
      {busy === target ? 'Preparing…' : label}
    </a>
  );

  return (
    <div className="grid gap-4 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]" data-testid="handoff-panel">
      <div className="flex flex-col gap-4">
        <section aria-labelledby={`${id}-pack`} className="flex flex-col gap-3 rounded-2xl border border-rule bg-card p-4 shadow-xs">
          <h3 id={`${id}-pack`} className="text-base font-extrabold">
            The hand-off pack
          </h3>
          <p className="text-sm text-ink-soft">Every file below in one zip, from the room’s design as it is now.</p>
          <div className="flex flex-wrap items-end gap-3">
            <div className="flex flex-col gap-1">
              <label htmlFor={`${id}-series`} className="text-sm font-semibold">
                Round part values to
              </label>
              <select id={`${id}-series`} className={controlClass(false)} value={series} onChange={(e) => setSeries(e.target.value as BomSeries | '')}>
                <option value="">E24 (L, C), E96 (R)</option>
                {BOM_SERIES.map((s) => (
                  <option key={s} value={s}>
                    {s} for every part
                  </option>
                ))}
              </select>
            </div>
            {link('handoff.zip', 'Download the hand-off pack (.zip)', true)}
          </div>
          {error?.target === 'handoff.zip' && (
            <p role="alert" className="text-sm font-semibold text-coral-deep">
              {error.message}
            </p>
          )}
        </section>
        <section aria-labelledby={`${id}-files`} className="rounded-2xl border border-rule bg-card p-4 shadow-xs">
          <h3 id={`${id}-files`} className="mb-3 text-base font-extrabold">
            Single files
          </h3>
          <ul className="flex flex-col divide-y divide-rule">
            {FILES.map((f) => (
              <li key={f.target} className="flex flex-wrap items-center justify-between gap-3 py-2.5">
                <div className="min-w-0 flex-1">
                  <p className="font-bold">{f.title}</p>
                  <p className="text-sm text-ink-soft">{f.detail}</p>
                  {error?.target === f.target && (
                    <p role="alert" className="mt-1 text-sm font-semibold text-coral-deep">
                      {error.message}
                    </p>
                  )}
                </div>
                {link(f.target, `Download ${f.target}`)}
              </li>
            ))}
          </ul>
        </section>
      </div>
      <Cautions className="self-start" />
    </div>
  );
}
