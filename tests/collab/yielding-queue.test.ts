// The background queue gives way to I/O between tasks once a turn's budget is used (common practice:
// Node runs every timer that is due in one timers phase, and setImmediate comes after the I/O poll).
import { describe, expect, it } from 'vitest';
import { createYieldingQueue } from '../../server/collab/yielding-queue';

const tick = () => new Promise<void>((r) => setImmediate(r));

describe('createYieldingQueue', () => {
  it('runs tasks in order, letting other work in between turns once the budget is spent', async () => {
    const order: string[] = [];
    const q = createYieldingQueue(0);
    q.push(() => {
      order.push('t1');
      // work that arrives while t1 runs (as socket data would) is queued behind it
      setImmediate(() => order.push('other'));
    });
    q.push(() => order.push('t2'));
    q.push(() => order.push('t3'));
    expect(q.size).toBe(3);
    for (let i = 0; i < 6; i++) await tick();
    expect(order).toEqual(['t1', 'other', 't2', 't3']);
    expect(q.size).toBe(0);
  });

  it('runs a turn’s tasks together while under budget', async () => {
    const order: string[] = [];
    const q = createYieldingQueue(10_000);
    q.push(() => {
      order.push('t1');
      setImmediate(() => order.push('other'));
    });
    q.push(() => order.push('t2'));
    for (let i = 0; i < 4; i++) await tick();
    expect(order).toEqual(['t1', 't2', 'other']);
  });

  it('reports a failing task and goes on with the rest', async () => {
    const errors: unknown[] = [];
    const order: string[] = [];
    const q = createYieldingQueue(0, (e) => errors.push(e));
    q.push(() => {
      throw new Error('boom');
    });
    q.push(() => order.push('after'));
    for (let i = 0; i < 4; i++) await tick();
    expect(order).toEqual(['after']);
    expect(errors).toHaveLength(1);
  });
});
