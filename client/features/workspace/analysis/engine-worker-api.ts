/**
 * What the engine worker exposes over comlink: the engine core's commands, with results'
 * Float64Array buffers marked for transfer. Kept apart from the worker entry so tests can expose
 * it on a MessageChannel in Node.
 */
import * as Comlink from 'comlink';
import type { Design } from '../../../../shared/rf/design';
import { engineCore, type EngineCore } from './engine-core';
import { transferablesOf } from './transferables';

export function engineWorkerApi(core: EngineCore = engineCore) {
  return {
    analyze(design: Design) {
      const out = core.analyze(design);
      return Comlink.transfer(out, transferablesOf(out));
    },
    findMatches(design: Design, opts?: object) {
      return core.findMatches(design, opts);
    },
    refine(design: Design, onProgress: (p: { iteration: number; worst: number }) => void) {
      const out = core.refine(design, (p) => void onProgress(p), () => false);
      return Comlink.transfer(out, transferablesOf(out));
    },
    yieldRun(design: Design, opts: { trials: number; seed: number }, onProgress: (done: number) => void) {
      const out = core.yieldRun(design, opts, (d) => void onProgress(d), () => false);
      return Comlink.transfer(out, transferablesOf(out));
    },
  };
}

export type EngineWorkerApi = ReturnType<typeof engineWorkerApi>;
