import { describe, expect, it } from 'vitest';
import { createRenderThrottle } from '../../client/features/workspace/collab/use-room-design';
import { parseDesign, type Design } from '../../shared/rf/design';
import { whipE12Design } from '../../shared/demo/designs';

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function designs(n: number): Design[] {
  const base = parseDesign(whipE12Design());
  return Array.from({ length: n }, (_, i) => ({ ...base, name: `step ${i}` }));
}

function deferred() {
  let resolve!: () => void;
  const promise = new Promise<void>((r) => (resolve = r));
  return { promise, resolve };
}

describe('createRenderThrottle (the screen’s renders of new designs)', () => {
  it('renders a design after a quiet spell once its analysis has been drawn, not before', async () => {
    const shown: string[] = [];
    const t = createRenderThrottle((d) => shown.push(d.name), { intervalMs: 30, maxWaitMs: 500 });
    const [a] = designs(1);
    const drawn = deferred();
    t.offer(a, drawn.promise);
    await sleep(20);
    expect(shown).toEqual([]);
    drawn.resolve();
    await sleep(0);
    expect(shown).toEqual([a.name]);
    t.dispose();
  });

  it('does not wait longer than maxWaitMs for work that never settles', async () => {
    const shown: string[] = [];
    const t = createRenderThrottle((d) => shown.push(d.name), { intervalMs: 10, maxWaitMs: 40 });
    const [a] = designs(1);
    t.offer(a, new Promise(() => undefined));
    await sleep(15);
    expect(shown).toEqual([]);
    await sleep(60);
    expect(shown).toEqual([a.name]);
    t.dispose();
  });

  it('renders a stream at most once per interval, always ending on the newest design', async () => {
    const shown: string[] = [];
    const t = createRenderThrottle((d) => shown.push(d.name), { intervalMs: 40, maxWaitMs: 100 });
    const all = designs(30);
    const started = performance.now();
    for (const d of all) {
      t.offer(d, Promise.resolve());
      await sleep(4);
    }
    await sleep(120);
    const elapsed = performance.now() - started;
    expect(shown[shown.length - 1]).toBe(all[all.length - 1].name);
    expect(shown.length).toBeLessThanOrEqual(Math.ceil(elapsed / 40) + 1);
    expect(shown.length).toBeLessThan(all.length);
    t.dispose();
  });

  it('flush renders the waiting design at once; after dispose nothing renders', async () => {
    const shown: string[] = [];
    const t = createRenderThrottle((d) => shown.push(d.name), { intervalMs: 1000, maxWaitMs: 1000 });
    const [a, b, c] = designs(3);
    t.offer(a, null);
    await sleep(0);
    expect(shown).toEqual([a.name]);
    t.offer(b, null);
    expect(shown).toEqual([a.name]);
    t.flush();
    expect(shown).toEqual([a.name, b.name]);
    t.offer(c, null);
    t.dispose();
    await sleep(10);
    expect(shown).toEqual([a.name, b.name]);
  });
});
