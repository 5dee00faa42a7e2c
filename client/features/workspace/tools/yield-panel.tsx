/**
 * The yield run: part tolerances drawn at random (a Monte Carlo of `trials` builds with a seed, so
 * a run can be repeated), the share of builds that meet the goal, the spread of the worst in-band
 * VSWR as a histogram, and the envelope of the band trace handed to the chart and the plot.
 */
import { useEffect, useRef, useState } from 'react';
import { goalMaxGamma, type Design } from '../../../../shared/rf/design';
import { vswrFromGamma } from '../../../../shared/rf/figures';
import { engineErrorMessage, type EngineClient } from '../analysis/engine-client';
import type { YieldResult } from '../analysis/engine-types';
import { elementName } from '../chain/element-catalog';
import { percentText, vswrText } from '../figures/figure-text';
import { smallButton } from '../inspector/small-button';
import { ValueField } from '../value/value-field';
import { YieldHistogram } from './yield-histogram';

export type YieldEnvelope = { minGamma: Float64Array; maxGamma: Float64Array } | null;

export interface YieldPanelProps {
  design: Design;
  client: EngineClient;
  onEnvelope(envelope: YieldEnvelope): void;
}

type RunState =
  | { phase: 'idle' }
  | { phase: 'running'; done: number; trials: number }
  | { phase: 'done'; result: YieldResult }
  | { phase: 'failed'; message: string };

export function YieldPanel({ design, client, onEnvelope }: YieldPanelProps) {
  const [trials, setTrials] = useState(500);
  const [seed, setSeed] = useState(1);
  const [state, setState] = useState<RunState>({ phase: 'idle' });
  const [showEnvelope, setShowEnvelope] = useState(true);
  const abort = useRef<AbortController | null>(null);
  useEffect(() => () => abort.current?.abort(), []);

  const toleranced = design.elements.filter((e) => e.tolerance);
  const result = state.phase === 'done' ? state.result : null;
  useEffect(() => {
    onEnvelope(result && showEnvelope && result.envelope ? { minGamma: result.envelope.minGamma, maxGamma: result.envelope.maxGamma } : null);
  }, [result, showEnvelope, onEnvelope]);
  useEffect(() => () => onEnvelope(null), [onEnvelope]);

  const run = async () => {
    const controller = new AbortController();
    abort.current = controller;
    setState({ phase: 'running', done: 0, trials });
    try {
      const out = await client.yieldRun(design, { trials, seed }, (done) => setState((s) => (s.phase === 'running' ? { ...s, done } : s)), controller.signal);
      setState({ phase: 'done', result: out });
    } catch (e) {
      if (e instanceof Error && e.name === 'AbortError') setState({ phase: 'idle' });
      else setState({ phase: 'failed', message: engineErrorMessage(e) });
    } finally {
      if (abort.current === controller) abort.current = null;
    }
  };

  const goalVswr = vswrFromGamma(goalMaxGamma(design.goal));
  const names = new Map(design.elements.map((e) => [e.id, elementName(e)]));
  return (
    <section aria-labelledby="yield-title" className="flex flex-col gap-2">
      <div className="flex items-center justify-between gap-2">
        <h3 id="yield-title" className="text-sm font-bold text-ink">
          Yield run
        </h3>
        {state.phase === 'running' ? (
          <button type="button" className={smallButton('danger')} onClick={() => abort.current?.abort()}>
            Cancel
          </button>
        ) : (
          <button type="button" className={smallButton('primary')} disabled={design.elements.length === 0} onClick={() => void run()}>
            Run
          </button>
        )}
      </div>
      <p className="text-xs text-ink-soft">
        {toleranced.length
          ? `Varies ${toleranced.map((e) => elementName(e)).join(', ')} within their tolerances.`
          : 'No part has a tolerance yet: give parts one in the Element tab (e.g. ±5 %), or every build comes out the same.'}
      </p>
      <div className="grid grid-cols-2 gap-2">
        <ValueField label="Trials" value={trials} unit="" digits={6} rules={{ min: 10, max: 100_000 }} onCommit={(v) => v !== undefined && setTrials(Math.round(v))} />
        <ValueField label="Seed" value={seed} unit="" digits={9} rules={{ min: 0, max: 2 ** 31 - 1 }} onCommit={(v) => v !== undefined && setSeed(Math.round(v))} />
      </div>
      {state.phase === 'running' && (
        <div role="status" className="flex flex-col gap-1 text-xs">
          <progress max={state.trials} value={state.done} className="w-full" aria-label="Yield run progress" />
          <span className="numeric">
            {state.done} of {state.trials} trials
          </span>
        </div>
      )}
      {state.phase === 'failed' && (
        <p role="alert" className="text-xs font-semibold text-coral-deep">
          {state.message}
        </p>
      )}
      {result && (
        <div className="flex flex-col gap-2" data-testid="yield-result">
          <p className="text-sm text-ink">
            <strong className="numeric text-base">{percentText(result.passFraction)}</strong> of {result.trials} builds meet the goal{' '}
            <span className="text-xs text-ink-faint">(seed {result.seed})</span>
            {result.stopped && <span className="text-xs text-amber-deep"> — stopped early</span>}
          </p>
          <p className="numeric text-xs text-ink-soft">
            Worst in-band VSWR: median {vswrText(result.worstVswr.p50)} · 95 % {vswrText(result.worstVswr.p95)} · max {vswrText(result.worstVswr.max)}
          </p>
          <YieldHistogram edges={result.histogram.vswrEdges} counts={result.histogram.counts} beyond={result.histogram.beyond} goalVswr={Number.isFinite(goalVswr) ? goalVswr : null} />
          {result.sensitivity.length > 0 && (
            <div className="text-xs">
              <p className="font-semibold text-ink-soft">Most sensitive parts (pass share when only that part varies)</p>
              <ul className="numeric">
                {result.sensitivity.slice(0, 4).map((s) => (
                  <li key={s.id}>
                    {names.get(s.id) ?? s.id}: {percentText(s.passFraction)}
                  </li>
                ))}
              </ul>
            </div>
          )}
          {result.envelope && (
            <label className="flex items-center gap-2 text-xs">
              <input type="checkbox" className="size-4 accent-ink" checked={showEnvelope} onChange={(e) => setShowEnvelope(e.target.checked)} />
              Show the spread on the chart and the plot
            </label>
          )}
        </div>
      )}
    </section>
  );
}
