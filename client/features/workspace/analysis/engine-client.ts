/**
 * FOR THE WORKSPACE ENGINEER: `getEngineClient()` is the one way the room screen talks to the engine.
 *   analyze(design)      -> { result, path }          (used by useAnalysis; prefer the hook)
 *   findMatches(design)  -> MatchResult               (shared/rf/match.ts's result)
 *   refine(design, onProgress, signal)  -> RefineResult   onProgress gets { iteration, worst (|Γ|), ... }
 *                                          aborting the signal rejects with an AbortError (in both modes)
 *   yieldRun(design, { trials, seed }, onProgress, signal) -> YieldResult
 * Types live in ./engine-types. Errors a user caused (DesignError) reject with an Error whose
 * `name` is "DesignError" and whose message is the sentence to show (`engineErrorMessage(e)`).
 *
 * One shared worker serves analysis and the match finder; refine and yield runs each get their own
 * worker, so that cancelling one terminates it without stalling live analysis. Where workers are
 * missing or fail to start, the same API runs the engine on the main thread.
 */
import type { Design } from '../../../../shared/rf/design';
import { engineCore as defaultCore, type EngineCore } from './engine-core';
import type { AnalysisResult, ImpedancePath, MatchResult, RefineResult, RefineTick, YieldResult } from './engine-types';
import { abortError } from './abort-error';
import { createWorkerEngineClient } from './worker-engine-client';

export interface EngineClient {
  analyze(design: Design): Promise<{ result: AnalysisResult; path: ImpedancePath }>;
  findMatches(design: Design, opts?: object): Promise<MatchResult>;
  refine(
    design: Design,
    onProgress: (p: RefineTick) => void,
    signal?: AbortSignal,
  ): Promise<RefineResult>;
  yieldRun(
    design: Design,
    opts: { trials: number; seed: number },
    onProgress?: (done: number) => void,
    signal?: AbortSignal,
  ): Promise<YieldResult>;
  /** "worker" or "main-thread": where the work runs now (shown nowhere, useful in tests and benches). */
  readonly mode: 'worker' | 'main-thread';
}

export { abortError };

/** The same API, computed on the calling thread. */
export function createMainThreadEngineClient(core: EngineCore = defaultCore): EngineClient {
  const guard = (signal?: AbortSignal) => {
    if (signal?.aborted) throw abortError();
  };
  return {
    mode: 'main-thread',
    async analyze(design) {
      return core.analyze(design);
    },
    async findMatches(design, opts) {
      return core.findMatches(design, opts);
    },
    async refine(design, onProgress, signal) {
      guard(signal);
      const out = await core.refine(design, onProgress, signal);
      guard(signal);
      return out;
    },
    async yieldRun(design, opts, onProgress, signal) {
      guard(signal);
      const out = core.yieldRun(design, opts, (d) => onProgress?.(d), () => signal?.aborted === true);
      guard(signal);
      return out;
    },
  };
}

let shared: EngineClient | null = null;

/** The room screen's one engine client (created on first use): workers where the browser has them. */
export function getEngineClient(): EngineClient {
  if (shared) return shared;
  const local = createMainThreadEngineClient();
  shared =
    typeof Worker === 'undefined'
      ? local
      : createWorkerEngineClient(() => new Worker(new URL('./engine.worker.ts', import.meta.url), { type: 'module', name: 'matchloom-engine' }), local);
  return shared;
}

/** A user-facing sentence for an engine failure: the DesignError's own message, never a stack. */
export function engineErrorMessage(e: unknown): string {
  if (e && typeof e === 'object' && 'message' in e && typeof (e as Error).message === 'string') {
    const err = e as Error;
    if (err.name === 'DesignError' || err.name === 'AbortError') return err.message;
    const first = err.message.split('\n')[0].trim();
    return first ? `The analysis could not run: ${first}` : 'The analysis could not run.';
  }
  return 'The analysis could not run.';
}
