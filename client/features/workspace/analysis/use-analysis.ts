/**
 * FOR THE WORKSPACE ENGINEER:
 *   const { result, path, error, pending } = useAnalysis(design);
 * Re-analyses on every new `design` object (pass the design read from the room document; keep the
 * same object while nothing changed). Newest request wins; a superseded one is never shown.
 * `error` is a sentence for the user (a DesignError message); while there is an error the last good
 * result stays available so the chart does not blank out.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import type { Design } from '../../../../shared/rf/design';
import { engineErrorMessage, getEngineClient, type EngineClient } from './engine-client';
import type { AnalysisResult, ImpedancePath } from './engine-types';
import { noteResultSource } from './draw-marks';
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

  useEffect(() => {
    if (!design) {
      scheduler.cancel();
      setState({ result: null, path: null, error: null, pending: false });
      return;
    }
    setState((s) => (s.pending ? s : { ...s, pending: true }));
    void scheduler.request(design).then((outcome) => {
      if (!alive.current || outcome.status === 'stale') return;
      const pending = scheduler.busy;
      if (outcome.status === 'done') {
        noteResultSource(outcome.value.result, outcome.seq, design);
        setState({ result: outcome.value.result, path: outcome.value.path, error: null, pending });
      } else setState((s) => ({ ...s, error: engineErrorMessage(outcome.error), pending }));
    });
  }, [design, scheduler]);

  return state;
}
