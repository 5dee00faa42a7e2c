/**
 * What the engine worker exposes over comlink: the engine core's commands, with results'
 * Float64Array buffers marked for transfer. Kept apart from the worker entry so tests can expose
 * it on a MessageChannel in Node.
 */
import * as Comlink from 'comlink';
import type { Design } from '../../../../shared/rf/design';
import { engineCore, type EngineCore } from './engine-core';
import type { RefineTick } from './engine-types';
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
    async refine(design: Design, onProgress: (p: RefineTick) => void) {
      const out = await core.refine(design, (p) => void onProgress(p));
      return Comlink.transfer(out, transferablesOf(out));
    },
    yieldRun(design: Design, opts: { trials: number; seed: number }, onProgress: (done: number) => void) {
      // terminating the worker is the cancellation; progress is sent at most every 50 ms
      let last = 0;
      const tick = (d: number) => {
        const now = Date.now();
        if (now - last < 50 && d < opts.trials) return;
        last = now;
        void onProgress(d);
      };
      const out = core.yieldRun(design, opts, tick, () => false);
      return Comlink.transfer(out, transferablesOf(out));
    },
  };
}

export type EngineWorkerApi = ReturnType<typeof engineWorkerApi>;
