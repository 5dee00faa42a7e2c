/**
 * The engine commands the worker and the main-thread fallback both run: thin, synchronous wrappers
 * over shared/rf (the same pure code everywhere). The worker file only routes calls to these.
 */
import { analyze } from '../../../../shared/rf/analyze';
import type { Design } from '../../../../shared/rf/design';
import { findMatches } from '../../../../shared/rf/match';
import type { AnalysisResult, ImpedancePath, MatchOptions, MatchResult, RefineResult, YieldResult } from './engine-types';
import { impedancePathOf } from './path-adapter';

export interface EngineCore {
  analyze(design: Design): { result: AnalysisResult; path: ImpedancePath };
  findMatches(design: Design, opts?: object): MatchResult;
  refine(design: Design, onProgress: (p: { iteration: number; worst: number }) => void, shouldStop: () => boolean): RefineResult;
  yieldRun(
    design: Design,
    opts: { trials: number; seed: number },
    onProgress: (done: number) => void,
    shouldStop: () => boolean,
  ): YieldResult;
}

const notYet = (what: string): never => {
  throw new Error(`The ${what} is not available in this build yet.`);
};

export const engineCore: EngineCore = {
  analyze(design) {
    const result = analyze(design);
    return { result, path: impedancePathOf(design, result) };
  },
  findMatches(design, opts) {
    return findMatches(design, (opts ?? {}) as MatchOptions);
  },
  refine: () => notYet('refine'),
  yieldRun: () => notYet('yield run'),
};
