/**
 * The engine commands the worker and the main-thread fallback both run: thin wrappers over
 * shared/rf (the same pure code everywhere). The worker file only routes calls to these.
 */
import { analyze } from '../../../../shared/rf/analyze';
import type { Design } from '../../../../shared/rf/design';
import { findMatches } from '../../../../shared/rf/match';
import { impedancePath } from '../../../../shared/rf/impedance-path';
import { refineDesignAsync } from '../../../../shared/rf/refine';
import { yieldRun } from '../../../../shared/rf/yield';
import type { AnalysisResult, ImpedancePath, MatchOptions, MatchResult, RefineResult, RefineTick, YieldResult } from './engine-types';

export interface EngineCore {
  analyze(design: Design): { result: AnalysisResult; path: ImpedancePath };
  findMatches(design: Design, opts?: object): MatchResult;
  /** Hands the thread back every few milliseconds; an aborted signal ends it with its best so far (`stopped: true`). */
  refine(design: Design, onProgress: (p: RefineTick) => void, signal?: AbortSignal): Promise<RefineResult>;
  yieldRun(design: Design, opts: { trials: number; seed: number }, onProgress: (done: number) => void, shouldStop: () => boolean): YieldResult;
}

export const engineCore: EngineCore = {
  analyze(design) {
    const result = analyze(design);
    return { result, path: impedancePath(design, result.centerHz) };
  },
  findMatches(design, opts) {
    return findMatches(design, (opts ?? {}) as MatchOptions);
  },
  refine(design, onProgress, signal) {
    return refineDesignAsync(design, { onProgress: (p) => onProgress({ ...p, worst: p.worstGamma }), signal });
  },
  yieldRun(design, opts, onProgress, shouldStop) {
    return yieldRun(design, { trials: opts.trials, seed: opts.seed, onProgress: (p) => onProgress(p.trialsDone), shouldStop });
  },
};
