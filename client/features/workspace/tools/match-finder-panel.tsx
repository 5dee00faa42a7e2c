/**
 * The match finder: networks that match the load perfectly at the centre, each with its figures
 * across the band and E-series alternatives. Hovering or focusing a candidate previews it on the
 * chart; Apply replaces the chain in one edit that everyone sees and the user can undo.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import type { Design, Element } from '../../../../shared/rf/design';
import { engineErrorMessage, type EngineClient } from '../analysis/engine-client';
import type { AnalysisResult, ImpedancePath, MatchCandidate, MatchResult } from '../analysis/engine-types';
import { elementValueLabel } from '../chain/element-summary';
import { kindInfo } from '../chain/element-catalog';
import { bandwidthFigure, returnLossText, vswrText } from '../figures/figure-text';
import { smallButton } from '../inspector/small-button';

export interface ChainPreview {
  result: AnalysisResult;
  path: ImpedancePath | null;
}

export interface MatchFinderPanelProps {
  design: Design;
  editable: boolean;
  /** the panel is in view; leaving it clears the preview */
  active: boolean;
  client: EngineClient;
  onPreview(preview: ChainPreview | null): void;
  onApply(elements: Element[], what: string): void;
}

/** The parts of the design a search depends on (not the chain: candidates replace it). */
function searchKey(d: Design): string {
  return JSON.stringify([d.load, d.band, d.sweep, d.goal, d.referenceOhms, d.port]);
}

function chainText(elements: readonly Element[]): string {
  return elements.map((e) => `${kindInfo(e.kind).name} ${elementValueLabel(e)}`).join(' → ');
}

interface Analysed {
  key: string;
  preview: ChainPreview | null;
}

export function MatchFinderPanel({ design, editable, active, client, onPreview, onApply }: MatchFinderPanelProps) {
  const [found, setFound] = useState<{ key: string; result: MatchResult } | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [analysed, setAnalysed] = useState<Record<string, Analysed>>({});
  const [pinned, setPinned] = useState<string | null>(null);
  const key = searchKey(design);
  const stale = found !== null && found.key !== key;
  const designRef = useRef(design);
  designRef.current = design;

  const search = async () => {
    setBusy(true);
    setError(null);
    setPinned(null);
    onPreview(null);
    try {
      const result = await client.findMatches(design);
      setFound({ key: searchKey(design), result });
      setAnalysed({});
    } catch (e) {
      setError(engineErrorMessage(e));
    } finally {
      setBusy(false);
    }
  };

  // Each candidate (and its snapped alternatives) analysed across the sweep, for its bandwidth and the preview.
  const variants = useMemo(() => {
    if (!found) return [];
    return found.result.candidates.flatMap((c, i) => [
      { id: `${i}`, elements: c.elements },
      ...c.snapped.map((s) => ({ id: `${i}:${s.series}`, elements: s.elements })),
    ]);
  }, [found]);
  useEffect(() => {
    let cancelled = false;
    void (async () => {
      for (const v of variants) {
        if (cancelled) return;
        try {
          const out = await client.analyze({ ...designRef.current, elements: v.elements });
          if (!cancelled) setAnalysed((a) => ({ ...a, [v.id]: { key: v.id, preview: out } }));
        } catch {
          if (!cancelled) setAnalysed((a) => ({ ...a, [v.id]: { key: v.id, preview: null } }));
        }
      }
    })();
    return () => {
      cancelled = true;
    };
  }, [variants, client]);

  const show = (id: string | null) => onPreview(id ? (analysed[id]?.preview ?? null) : null);
  const hover = (id: string) => show(id);
  const unhover = () => show(pinned);
  // Leaving the panel (another tab) clears the preview; coming back shows the pinned one again.
  useEffect(() => {
    if (!active) onPreview(null);
    else if (pinned) onPreview(analysed[pinned]?.preview ?? null);
  }, [active]);
  useEffect(() => () => onPreview(null), [onPreview]);

  const candidates = found?.result.candidates ?? [];
  return (
    <section aria-labelledby="finder-title" className="flex flex-col gap-2">
      <div className="flex items-center justify-between gap-2">
        <h3 id="finder-title" className="text-sm font-bold text-ink">
          Match finder
        </h3>
        <button type="button" className={smallButton('primary')} onClick={() => void search()} disabled={busy}>
          {busy ? 'Searching…' : found ? 'Search again' : 'Find matches'}
        </button>
      </div>
      {!found && !busy && !error && (
        <p className="text-xs text-ink-soft">Finds networks (L-sections, pi and tee, stubs, transformers) that match the load perfectly at the centre frequency.</p>
      )}
      {error && (
        <p role="alert" className="text-xs font-semibold text-coral-deep">
          {error}
        </p>
      )}
      {stale && <p className="text-xs text-amber-deep">The load, band or goal changed since this search: search again for fresh candidates.</p>}
      {found && candidates.length === 0 && (
        <p className="text-xs text-ink-soft">{found.result.explanation ?? 'No network was found for this load.'}</p>
      )}
      <ol className="flex flex-col gap-2" aria-label="Candidates">
        {candidates.map((c, i) => (
          <CandidateCard
            key={`${c.topology}-${i}`}
            index={i}
            candidate={c}
            design={design}
            analysed={analysed}
            pinned={pinned}
            editable={editable && !stale}
            onHover={hover}
            onUnhover={unhover}
            onPin={(id) => {
              const next = pinned === id ? null : id;
              setPinned(next);
              show(next);
            }}
            onApply={(elements, what) => {
              setPinned(null);
              onPreview(null);
              onApply(elements, what);
            }}
          />
        ))}
      </ol>
      {found && found.result.notes.length > 0 && (
        <details className="text-[11px] text-ink-faint">
          <summary>Notes from the search</summary>
          <ul className="list-disc pl-4">
            {found.result.notes.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
        </details>
      )}
    </section>
  );
}

function Figures({ design, worst, meets, analysed }: { design: Design; worst: MatchCandidate['worstInBand']; meets: boolean; analysed?: Analysed }) {
  const bw = analysed?.preview ? bandwidthFigure(design, analysed.preview.result.bandwidth) : null;
  return (
    <span className="numeric text-[11px] text-ink-soft">
      worst VSWR {vswrText(worst.vswr)} · RL {returnLossText(worst.returnLossDb)} ·{' '}
      {analysed ? (bw ? `bandwidth ${bw.width} (${bw.fractional})` : 'no bandwidth at the goal') : 'bandwidth …'}{' '}
      <span className={meets ? 'font-bold text-teal-deep' : 'font-bold text-coral-deep'}>{meets ? 'meets the goal' : 'misses the goal'}</span>
    </span>
  );
}

function CandidateCard(props: {
  index: number;
  candidate: MatchCandidate;
  design: Design;
  analysed: Record<string, Analysed>;
  pinned: string | null;
  editable: boolean;
  onHover(id: string): void;
  onUnhover(): void;
  onPin(id: string): void;
  onApply(elements: Element[], what: string): void;
}) {
  const { index, candidate: c, design, analysed, pinned, editable } = props;
  const id = `${index}`;
  const isPinned = pinned === id;
  return (
    <li
      className={isPinned ? 'rounded-md border-2 border-amber bg-amber-soft/40 p-2' : 'rounded-md border border-rule bg-card p-2'}
      onMouseEnter={() => props.onHover(id)}
      onMouseLeave={props.onUnhover}
      onFocus={() => props.onHover(id)}
      onBlur={props.onUnhover}
      data-testid="match-candidate"
    >
      <div className="flex items-start justify-between gap-2">
        <div className="min-w-0">
          <p className="text-sm font-bold text-ink">{c.title}</p>
          <p className="numeric text-xs text-ink">{chainText(c.elements)}</p>
          <Figures design={design} worst={c.worstInBand} meets={c.meetsGoal} analysed={analysed[id]} />
          {c.note && <p className="text-[11px] text-ink-faint">{c.note}</p>}
        </div>
        <div className="flex shrink-0 flex-col gap-1">
          <button type="button" className={smallButton()} aria-pressed={isPinned} onClick={() => props.onPin(id)}>
            {isPinned ? 'Previewing' : 'Preview'}
          </button>
          {editable && (
            <button type="button" className={smallButton('primary')} onClick={() => props.onApply(c.elements, c.title)} aria-label={`Apply ${c.title}`}>
              Apply
            </button>
          )}
        </div>
      </div>
      {c.snapped.length > 0 && (
        <ul className="mt-1.5 flex flex-col gap-1 border-t border-rule/60 pt-1.5" aria-label={`E-series alternatives of ${c.title}`}>
          {c.snapped.map((s) => {
            const sid = `${index}:${s.series}`;
            return (
              <li key={s.series} className="flex items-start justify-between gap-2" onMouseEnter={() => props.onHover(sid)} onMouseLeave={() => props.onHover(id)}>
                <div className="min-w-0">
                  <p className="numeric text-xs text-ink">
                    <span className="font-bold">{s.series}:</span> {chainText(s.elements)}
                  </p>
                  <Figures design={design} worst={s.worstInBand} meets={s.meetsGoal} analysed={analysed[sid]} />
                </div>
                {editable && (
                  <button
                    type="button"
                    className={smallButton()}
                    onClick={() => props.onApply(s.elements, `${c.title} (${s.series} values)`)}
                    aria-label={`Apply ${c.title} with ${s.series} values`}
                  >
                    Apply {s.series}
                  </button>
                )}
              </li>
            );
          })}
        </ul>
      )}
    </li>
  );
}
