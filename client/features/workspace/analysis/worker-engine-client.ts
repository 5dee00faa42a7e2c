/**
 * The engine client over Web Workers (comlink). One long-lived worker serves analysis and the
 * match finder; refine and yield runs each get a worker of their own, terminated when their signal
 * aborts. If a worker cannot start or dies, the call is re-run on the main-thread `fallback` and
 * every later call goes there too.
 */
import * as Comlink from 'comlink';
import type { EngineClient } from './engine-client';
import { abortError } from './abort-error';
import type { EngineWorkerApi } from './engine-worker-api';

export type WorkerFactory = () => Worker;

/** An error that comes from the engine itself (bad input), as opposed to the worker machinery. */
export function isEngineError(e: unknown): boolean {
  const name = (e as { name?: unknown } | null)?.name;
  return name === 'DesignError' || name === 'MatchOptionError' || name === 'UnitError' || name === 'TouchstoneError' || name === 'TouchstoneRangeError';
}

interface Handle {
  worker: Worker;
  api: Comlink.Remote<EngineWorkerApi>;
  /** rejects when the worker reports an error event (failed to load, crashed) */
  dead: Promise<never>;
}

function open(factory: WorkerFactory): Handle {
  const worker = factory();
  const api = Comlink.wrap<EngineWorkerApi>(worker);
  const dead = new Promise<never>((_, reject) => {
    const fail = (ev: Event) => {
      const msg = (ev as ErrorEvent).message;
      reject(new Error(`the analysis worker stopped${msg ? ` (${msg})` : ''}`));
    };
    worker.addEventListener('error', fail);
    worker.addEventListener('messageerror', fail);
  });
  dead.catch(() => undefined); // observed through race() only
  return { worker, api, dead };
}

export function createWorkerEngineClient(factory: WorkerFactory, fallback: EngineClient): EngineClient {
  let shared: Handle | null = null;
  let broken = false;

  const sharedHandle = (): Handle | null => {
    if (broken) return null;
    if (!shared) {
      try {
        shared = open(factory);
      } catch {
        broken = true;
        return null;
      }
    }
    return shared;
  };

  const giveUp = () => {
    broken = true;
    shared?.worker.terminate();
    shared = null;
  };

  /** Run on the shared worker; a worker failure (not a user error) moves the call to the main thread. */
  async function onShared<T>(remote: (api: Comlink.Remote<EngineWorkerApi>) => Promise<T>, local: () => Promise<T>): Promise<T> {
    const h = sharedHandle();
    if (!h) return local();
    try {
      return await Promise.race([remote(h.api), h.dead]);
    } catch (e) {
      if (isEngineError(e)) throw e;
      giveUp();
      return local();
    }
  }

  /** Run a long job on its own worker so that aborting it can terminate it. */
  async function onJob<T>(
    remote: (api: Comlink.Remote<EngineWorkerApi>) => Promise<T>,
    local: () => Promise<T>,
    signal?: AbortSignal,
  ): Promise<T> {
    if (signal?.aborted) throw abortError();
    if (broken) return local();
    let h: Handle;
    try {
      h = open(factory);
    } catch {
      broken = true;
      return local();
    }
    const aborted = new Promise<never>((_, reject) => {
      signal?.addEventListener('abort', () => reject(abortError()), { once: true });
    });
    aborted.catch(() => undefined);
    try {
      return await Promise.race([remote(h.api), h.dead, aborted]);
    } catch (e) {
      if (isEngineError(e) || (e as Error)?.name === 'AbortError') throw e;
      broken = true;
      return local();
    } finally {
      h.api[Comlink.releaseProxy]();
      h.worker.terminate();
    }
  }

  return {
    get mode() {
      return broken ? 'main-thread' : 'worker';
    },
    analyze(design) {
      return onShared(
        (api) => api.analyze(design),
        () => fallback.analyze(design),
      );
    },
    findMatches(design, opts) {
      return onShared(
        (api) => api.findMatches(design, opts),
        () => fallback.findMatches(design, opts),
      );
    },
    refine(design, onProgress, signal) {
      return onJob(
        (api) => api.refine(design, Comlink.proxy(onProgress)),
        () => fallback.refine(design, onProgress, signal),
        signal,
      );
    },
    yieldRun(design, opts, onProgress, signal) {
      return onJob(
        (api) => api.yieldRun(design, opts, Comlink.proxy((d: number) => onProgress?.(d))),
        () => fallback.yieldRun(design, opts, onProgress, signal),
        signal,
      );
    },
  };
}
