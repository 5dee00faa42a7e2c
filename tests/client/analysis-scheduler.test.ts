import { describe, expect, it } from 'vitest';
import { createLatestScheduler, type ScheduledOutcome } from '../../client/features/workspace/analysis/latest-scheduler';

/** A fake async engine: every call waits until the test resolves or rejects it. */
function fakeEngine() {
  const calls: { input: number; resolve: (v: string) => void; reject: (e: unknown) => void }[] = [];
  const run = (input: number) =>
    new Promise<string>((resolve, reject) => {
      calls.push({ input, resolve, reject });
    });
  return { calls, run };
}
const tick = () => new Promise((r) => setTimeout(r, 0));

describe('createLatestScheduler', () => {
  it('runs a lone request and delivers its value', async () => {
    const e = fakeEngine();
    const s = createLatestScheduler(e.run);
    const p = s.request(1);
    expect(e.calls.map((c) => c.input)).toEqual([1]);
    e.calls[0].resolve('r1');
    expect(await p).toEqual({ status: 'done', value: 'r1', seq: 1 });
    expect(s.busy).toBe(false);
  });

  it('runs one request at a time; a newer request replaces the waiting one, which never runs', async () => {
    const e = fakeEngine();
    const s = createLatestScheduler(e.run);
    const p1 = s.request(1);
    const p2 = s.request(2);
    const p3 = s.request(3);
    expect(await p2).toEqual({ status: 'stale', seq: 2 });
    expect(e.calls.map((c) => c.input)).toEqual([1]); // 2 and 3 wait; 2 is already dropped
    e.calls[0].resolve('r1');
    expect((await p1).status).toBe('done'); // the freshest finished work still shows during a drag
    await tick();
    expect(e.calls.map((c) => c.input)).toEqual([1, 3]);
    e.calls[1].resolve('r3');
    expect(await p3).toEqual({ status: 'done', value: 'r3', seq: 3 });
  });

  it('reports a failure as an outcome (never rejects) and carries on with the next request', async () => {
    const e = fakeEngine();
    const s = createLatestScheduler(e.run);
    const p1 = s.request(1);
    const p2 = s.request(2);
    e.calls[0].reject(new Error('elements[0].value: must be a positive number of henries'));
    const o1 = await p1;
    expect(o1.status).toBe('failed');
    await tick();
    e.calls[1].resolve('r2');
    expect((await p2).status).toBe('done');
  });

  it('treats a run function that throws synchronously as a failure', async () => {
    const s = createLatestScheduler((_: number): Promise<string> => {
      throw new Error('boom');
    });
    const o = await s.request(1);
    expect(o.status).toBe('failed');
    expect(s.busy).toBe(false);
  });

  it('cancel() drops the waiting request and ignores the running one', async () => {
    const e = fakeEngine();
    const s = createLatestScheduler(e.run);
    const p1 = s.request(1);
    const p2 = s.request(2);
    s.cancel();
    expect(await p2).toEqual({ status: 'stale', seq: 2 });
    e.calls[0].resolve('r1');
    expect(await p1).toEqual({ status: 'stale', seq: 1 });
    await tick();
    expect(e.calls).toHaveLength(1);
    const p3 = s.request(3);
    e.calls[1].resolve('r3');
    expect((await p3).status).toBe('done');
  });

  it('keeps a burst of 1,000 requests to at most two engine calls in flight order', async () => {
    const e = fakeEngine();
    const s = createLatestScheduler(e.run);
    const all: Promise<ScheduledOutcome<string>>[] = [];
    for (let i = 1; i <= 1000; i++) all.push(s.request(i));
    e.calls[0].resolve('first');
    await tick();
    e.calls[1].resolve('last');
    const outs = await Promise.all(all);
    expect(e.calls.map((c) => c.input)).toEqual([1, 1000]);
    expect(outs.filter((o) => o.status === 'done').map((o) => o.seq)).toEqual([1, 1000]);
  });
});
