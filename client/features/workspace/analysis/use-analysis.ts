/**
 * FOR THE WORKSPACE ENGINEER:
 *   const { result, path, error, pending } = useAnalysis(design);
 * Re-analyses whenever the design's content changes (a new object with the same content is not
 * re-analysed, so passing a freshly built design on every render is safe). Newest request wins; a
 * superseded one is never shown.
 * `error` is a sentence for the user (a DesignError message); while there is an error the last good
 * result stays available so the chart does not blank out.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import type { Design } from '../../../../shared/rf/design';
import { engineErrorMessage, getEngineClient, type EngineClient } from './engine-client';
import type { AnalysisResult, ImpedancePath } from './engine-types';
import { markStage, noteResultSource } from './draw-marks';
import { createLatestScheduler } from './latest-scheduler';

export interface AnalysisState {
  result: AnalysisResult | null;
  path: ImpedancePath | null;
  error: string | null;
  pending: boolean;
}

export function useAnalysis(design: Design | null, client: EngineClient = getEngineClient()): AnalysisState {
  const scheduler = useMemo(() => createLatestScheduler((d: Design) => client.analyze(d)), [client]);
  const [state, setState] = useState<AnalysisState>({ result: null, path: null, error: null, pending: false });
  const alive = useRef(true);

  useEffect(() => {
    alive.current = true;
    return () => {
      alive.current = false;
      scheduler.cancel();
    };
  }, [scheduler]);

  // Content, not identity, decides whether to re-analyse.
  const key = useMemo(() => (design ? JSON.stringify(design) : ''), [design]);
  const current = useRef(design);
  current.current = design;

  useEffect(() => {
    const design = current.current;
    if (!design) {
      scheduler.cancel();
      setState({ result: null, path: null, error: null, pending: false });
      return;
    }
    setState((s) => (s.pending ? s : { ...s, pending: true }));
    markStage('requested', scheduler.issued + 1);
    void scheduler.request(design).then((outcome) => {
      if (outcome.status !== 'stale') markStage('analysed', outcome.seq);
      if (!alive.current || outcome.status === 'stale') return;
      const pending = scheduler.busy;
      if (outcome.status === 'done') {
        noteResultSource(outcome.value.result, outcome.seq, design);
        setState({ result: outcome.value.result, path: outcome.value.path, error: null, pending });
      } else setState((s) => ({ ...s, error: engineErrorMessage(outcome.error), pending }));
    });
  }, [key, scheduler]);

  return state;
}
