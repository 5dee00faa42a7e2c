/**
 * Refine: tunes every unlocked element to bring the worst reflection across the band down, with
 * live progress and Cancel. The result is shown beside the current figures; Apply writes the
 * changed values in one edit.
 */
import { useEffect, useRef, useState } from 'react';
import type { Design } from '../../../../shared/rf/design';
import { vswrFromGamma } from '../../../../shared/rf/figures';
import { engineErrorMessage, type EngineClient } from '../analysis/engine-client';
import type { RefineResult } from '../analysis/engine-types';
import { vswrText } from '../figures/figure-text';
import { smallButton } from '../inspector/small-button';
import { tunedFieldChanges, type FieldChange } from './tuned-changes';

export interface RefinePanelProps {
  design: Design;
  editable: boolean;
  client: EngineClient;
  onApply(changes: FieldChange[]): void;
}

type RunState =
  | { phase: 'idle' }
  | { phase: 'running'; iteration: number; worstGamma: number | null }
  | { phase: 'done'; result: RefineResult; changes: FieldChange[] }
  | { phase: 'failed'; message: string };

export function RefinePanel({ design, editable, client, onApply }: RefinePanelProps) {
  const [state, setState] = useState<RunState>({ phase: 'idle' });
  const abort = useRef<AbortController | null>(null);
  useEffect(() => () => abort.current?.abort(), []);

  const free = design.elements.filter((e) => !e.locked && e.kind !== 'two-port');
  const start = async () => {
    const controller = new AbortController();
    abort.current = controller;
    setState({ phase: 'running', iteration: 0, worstGamma: null });
    try {
      const result = await client.refine(
        design,
        (p) => setState((s) => (s.phase === 'running' ? { phase: 'running', iteration: p.iteration, worstGamma: p.worst } : s)),
        controller.signal,
      );
      setState({ phase: 'done', result, changes: tunedFieldChanges(design.elements, result.design.elements) });
    } catch (e) {
      if (e instanceof Error && e.name === 'AbortError') setState({ phase: 'idle' });
      else setState({ phase: 'failed', message: engineErrorMessage(e) });
    } finally {
      if (abort.current === controller) abort.current = null;
    }
  };

  return (
    <section aria-labelledby="refine-title" className="flex flex-col gap-2">
      <div className="flex items-center justify-between gap-2">
        <h3 id="refine-title" className="text-sm font-bold text-ink">
          Refine
        </h3>
        {editable &&
          (state.phase === 'running' ? (
            <button type="button" className={smallButton('danger')} onClick={() => abort.current?.abort()}>
              Cancel
            </button>
          ) : (
            <button type="button" className={smallButton('primary')} disabled={free.length === 0} onClick={() => void start()}>
              Refine across the band
            </button>
          ))}
      </div>
      <p className="text-xs text-ink-soft">
        Tunes {free.length ? `${free.length} unlocked element${free.length === 1 ? '' : 's'}` : 'the unlocked elements'} to bring the worst reflection in the
        band down. Lock an element to keep its value.
      </p>
      {state.phase === 'running' && (
        <p role="status" className="numeric text-xs text-ink" data-testid="refine-progress">
          Iteration {state.iteration}
          {state.worstGamma !== null && <> · worst VSWR so far {vswrText(vswrFromGamma(state.worstGamma))}</>}
        </p>
      )}
      {state.phase === 'failed' && (
        <p role="alert" className="text-xs font-semibold text-coral-deep">
          {state.message}
        </p>
      )}
      {state.phase === 'done' && (
        <div role="status" className="rounded-md border border-rule bg-card p-2 text-xs">
          <p className="numeric text-ink">
            {state.result.stopped ? 'Stopped early' : 'Finished'} after {state.result.iterations} iterations: worst VSWR{' '}
            {vswrText(vswrFromGamma(state.result.initialWorstGamma))} → <strong>{vswrText(state.result.worstInBand.vswr)}</strong>
          </p>
          {!state.result.improved || state.changes.length === 0 ? (
            <p className="mt-1 text-ink-soft">No better values were found: the chain stays as it is.</p>
          ) : (
            editable && (
              <div className="mt-1.5 flex gap-2">
                <button
                  type="button"
                  className={smallButton('primary')}
                  onClick={() => {
                    onApply(state.changes);
                    setState({ phase: 'idle' });
                  }}
                >
                  Apply refined values
                </button>
                <button type="button" className={smallButton()} onClick={() => setState({ phase: 'idle' })}>
                  Discard
                </button>
              </div>
            )
          )}
        </div>
      )}
    </section>
  );
}
