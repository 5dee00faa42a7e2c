import { afterEach, describe, expect, it } from 'vitest';
import { analyze } from '../../shared/rf/analyze';
import { createMainThreadEngineClient, engineErrorMessage, getEngineClient } from '../../client/features/workspace/analysis/engine-client';
import { engineCore, type EngineCore } from '../../client/features/workspace/analysis/engine-core';
import { engineWorkerApi } from '../../client/features/workspace/analysis/engine-worker-api';
import { createWorkerEngineClient } from '../../client/features/workspace/analysis/worker-engine-client';
import * as Comlink from 'comlink';
import { zToGamma } from '../../client/features/workspace/chart/geometry';
import type { RefineResult } from '../../client/features/workspace/analysis/engine-types';
import { chipAntennaDesign, outOfRangeDesign } from './analysis-fixtures';

/**
 * A stand-in for a Web Worker in Node: a MessageChannel whose far end exposes the real worker API
 * (the same code the browser worker runs). `fail()` fires the error event a crashed worker fires.
 */
function channelWorker(core: EngineCore = engineCore) {
  const { port1, port2 } = new MessageChannel();
  Comlink.expose(engineWorkerApi(core), port2);
  let terminated = false;
  const w = port1 as unknown as Worker & { fail(): void; readonly terminated: boolean };
  Object.defineProperty(w, 'terminated', { get: () => terminated });
  w.terminate = () => {
    terminated = true;
    port1.close();
    port2.close();
  };
  w.fail = () => port1.dispatchEvent(new Event('error'));
  return w;
}

const opened: { terminate(): void }[] = [];
afterEach(() => {
  for (const w of opened.splice(0)) w.terminate();
});

describe('main-thread engine client', () => {
  it('analyze returns the engine result (same code as shared/rf analyze) and one path segment per element', async () => {
    const design = chipAntennaDesign();
    const client = createMainThreadEngineClient();
    expect(client.mode).toBe('main-thread');
    const { result, path } = await client.analyze(design);
    const direct = analyze(design);
    expect(Array.from(result.gamma)).toEqual(Array.from(direct.gamma));
    expect(result.frequenciesHz).toHaveLength(101);
    expect(path.segments.map((s) => s.id)).toEqual(['c1', 'l1']);
    expect(path.segments.map((s) => s.kind)).toEqual(['shunt-c', 'series-l']);
    // the path starts at the load's Γ at the centre and ends at the input Γ there (Γ = (z − z0)/(z + z0))
    const g = (z: [number, number]) => zToGamma(z, 50);
    expect(path.load[0]).toBeCloseTo(g(result.stagesAtCenter[0].z)[0], 9);
    expect(path.load[1]).toBeCloseTo(g(result.stagesAtCenter[0].z)[1], 9);
    const last = path.segments[1].gamma;
    const gEnd = g(result.stagesAtCenter[2].z);
    expect(last[last.length - 2]).toBeCloseTo(gEnd[0], 9);
    expect(last[last.length - 1]).toBeCloseTo(gEnd[1], 9);
    expect(path.hz).toBe(2.44e9);
  });

  it('rejects a design the engine refuses with the DesignError sentence, no stack', async () => {
    const client = createMainThreadEngineClient();
    const err = await client.analyze(outOfRangeDesign()).then(
      () => null,
      (e: unknown) => e,
    );
    expect((err as Error).name).toBe('DesignError');
    const msg = engineErrorMessage(err);
    expect(msg).toMatch(/^load\.points: frequency .* lies outside the table's range/);
    expect(msg).not.toMatch(/\n|at .*\.ts/);
  });

  it('engineErrorMessage keeps only the first line of an unexpected error', () => {
    const e = new Error('bad thing\n    at foo (x.ts:1:1)');
    expect(engineErrorMessage(e)).toBe('The analysis could not run: bad thing');
    expect(engineErrorMessage('???')).toBe('The analysis could not run.');
  });

  it('findMatches runs the match finder and every candidate matches at the centre', async () => {
    const design = chipAntennaDesign({ elements: [] });
    const m = await createMainThreadEngineClient().findMatches(design);
    expect(m.candidates.length).toBeGreaterThan(0);
    for (const c of m.candidates) expect(c.gammaAtCenter).toBeLessThan(1e-6);
  });

  it('an aborted refine or yield run rejects with AbortError before it starts', async () => {
    const ac = new AbortController();
    ac.abort();
    const client = createMainThreadEngineClient();
    await expect(client.refine(chipAntennaDesign(), () => undefined, ac.signal)).rejects.toMatchObject({ name: 'AbortError' });
    await expect(client.yieldRun(chipAntennaDesign(), { trials: 10, seed: 1 }, undefined, ac.signal)).rejects.toMatchObject({ name: 'AbortError' });
  });

  it('getEngineClient falls back to the main thread where there is no Worker (Node)', () => {
    expect(typeof Worker).toBe('undefined');
    expect(getEngineClient().mode).toBe('main-thread');
    expect(getEngineClient()).toBe(getEngineClient());
  });
});

describe('worker engine client (comlink over a MessageChannel)', () => {
  it('gives the same result as the main thread, with the result buffers transferred', async () => {
    const design = chipAntennaDesign();
    let kept: { gamma: Float64Array } | null = null;
    const spyCore: EngineCore = {
      ...engineCore,
      analyze(d) {
        const out = engineCore.analyze(d);
        kept = out.result;
        return out;
      },
    };
    const client = createWorkerEngineClient(() => {
      const w = channelWorker(spyCore);
      opened.push(w);
      return w;
    }, createMainThreadEngineClient());
    const { result, path } = await client.analyze(design);
    expect(client.mode).toBe('worker');
    expect(Array.from(result.gamma)).toEqual(Array.from(analyze(design).gamma));
    expect(path.segments).toHaveLength(2);
    expect(result.gamma).toBeInstanceOf(Float64Array);
    expect(kept!.gamma.buffer.byteLength).toBe(0); // moved, not copied: the sender's copy is detached
  });

  it('passes an engine error through as itself and keeps using the worker', async () => {
    const client = createWorkerEngineClient(() => {
      const w = channelWorker();
      opened.push(w);
      return w;
    }, createMainThreadEngineClient());
    const err = await client.analyze(outOfRangeDesign()).catch((e: unknown) => e);
    expect((err as Error).name).toBe('DesignError');
    expect(engineErrorMessage(err)).toMatch(/^load\.points: /);
    expect(client.mode).toBe('worker');
  });

  it('re-runs a call on the main thread when the worker dies, and stays there', async () => {
    let spawned = 0;
    const client = createWorkerEngineClient(() => {
      spawned++;
      const w = channelWorker({
        ...engineCore,
        analyze() {
          // the worker never answers: it crashes instead
          setTimeout(() => w.fail(), 0);
          return new Promise(() => undefined) as never;
        },
      });
      opened.push(w);
      return w;
    }, createMainThreadEngineClient());
    const design = chipAntennaDesign();
    const { result } = await client.analyze(design);
    expect(Array.from(result.gamma)).toEqual(Array.from(analyze(design).gamma));
    expect(client.mode).toBe('main-thread');
    await client.analyze(design);
    expect(spawned).toBe(1);
  });

  it('falls back when the worker cannot even be created', async () => {
    const client = createWorkerEngineClient(() => {
      throw new Error('workers are disabled');
    }, createMainThreadEngineClient());
    const { path } = await client.analyze(chipAntennaDesign());
    expect(path.segments).toHaveLength(2);
    expect(client.mode).toBe('main-thread');
  });

  it('runs a refine on its own worker, relays progress, and terminates that worker when done', async () => {
    const workers: ReturnType<typeof channelWorker>[] = [];
    const fakeRefine: EngineCore = {
      ...engineCore,
      async refine(design, onProgress) {
        for (let i = 1; i <= 3; i++) onProgress({ phase: 'refine', iteration: i, evaluations: 10 * i, worstGamma: 1 / i, worst: 1 / i });
        return { design, iterations: 3 } as unknown as RefineResult;
      },
    };
    const client = createWorkerEngineClient(() => {
      const w = channelWorker(fakeRefine);
      workers.push(w);
      opened.push(w);
      return w;
    }, createMainThreadEngineClient(fakeRefine));
    const seen: number[] = [];
    const out = await client.refine(chipAntennaDesign(), (p) => seen.push(p.iteration));
    expect(out.iterations).toBe(3);
    await new Promise((r) => setTimeout(r, 10));
    expect(seen).toEqual([1, 2, 3]);
    expect(workers).toHaveLength(1);
    expect(workers[0].terminated).toBe(true);
  });

  it('aborting a yield run rejects at once with AbortError and terminates its worker', async () => {
    const workers: ReturnType<typeof channelWorker>[] = [];
    const slow: EngineCore = { ...engineCore, yieldRun: () => new Promise(() => undefined) as never };
    const client = createWorkerEngineClient(() => {
      const w = channelWorker(slow);
      workers.push(w);
      opened.push(w);
      return w;
    }, createMainThreadEngineClient(slow));
    const ac = new AbortController();
    const run = client.yieldRun(chipAntennaDesign(), { trials: 100, seed: 7 }, undefined, ac.signal);
    setTimeout(() => ac.abort(), 5);
    await expect(run).rejects.toMatchObject({ name: 'AbortError' });
    expect(workers[0].terminated).toBe(true);
    expect(client.mode).toBe('worker'); // a cancelled run is not a broken worker
  });
});
