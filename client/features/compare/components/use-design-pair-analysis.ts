/**
 * Both sides of a comparison analysed by the room screen's engine client (a worker where there is one),
 * re-run only when a design's content changes. A design the engine refuses gives its sentence, not a crash.
 */
import { useEffect, useMemo, useState } from 'react';
import type { Design } from '../../../../shared/rf/design';
import { engineErrorMessage, getEngineClient, type EngineClient } from '../../workspace/analysis/engine-client';
import type { AnalysisResult, ImpedancePath } from '../../workspace/analysis/engine-types';

export type SideAnalysis =
  | { state: 'running' }
  | { state: 'done'; result: AnalysisResult; path: ImpedancePath }
  | { state: 'failed'; message: string };

function useAnalysed(design: Design | null, engine: () => EngineClient): SideAnalysis {
  const key = useMemo(() => (design ? JSON.stringify(design) : ''), [design]);
  const [state, setState] = useState<{ key: string; analysis: SideAnalysis }>({ key: '', analysis: { state: 'running' } });
  useEffect(() => {
    if (!design) return;
    let live = true;
    engine()
      .analyze(design)
      .then(
        ({ result, path }) => live && setState({ key, analysis: { state: 'done', result, path } }),
        (error: unknown) => live && setState({ key, analysis: { state: 'failed', message: engineErrorMessage(error) } }),
      );
    return () => {
      live = false;
    };
    // Keyed by content: a refetch that brings the same design back does not analyse it again.
  }, [key]);
  return state.key === key ? state.analysis : { state: 'running' };
}

export function useDesignPairAnalysis(a: Design | null, b: Design | null, engine: () => EngineClient = getEngineClient) {
  return { a: useAnalysed(a, engine), b: useAnalysed(b, engine) };
}
