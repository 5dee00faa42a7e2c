import { describe, expect, it } from 'vitest';
import { analyze } from '../../shared/rf/index';
import { parseDesign, type Design, type DesignInput, type Element } from '../../shared/rf/design';
import { elementDrawn, percentileSorted, yieldRun, yieldRunAsync, YieldOptionError } from '../../shared/rf/yield';
import { prngFrom } from '../../shared/rf/prng';

const FC = 2.44e9;
function designOf(elements: DesignInput['elements']): Design {
  return parseDesign({
    format: 'matchloom-design',
    version: 1,
    referenceOhms: 50,
    load: { kind: 'rlc', topology: 'parallel', r: 200, c: 2e-12 },
    band: { startHz: 2.3e9, stopHz: 2.6e9, centerHz: FC },
    sweep: { startHz: 1.8e9, stopHz: 3.1e9, points: 101 },
    goal: { maxVswr: 2 },
    elements,
  });
}
const ladder = (tol: (i: number) => NonNullable<DesignInput['elements']>[number]['tolerance']) =>
  designOf([
    { id: 'L1', kind: 'series-l', value: 1.85e-9, tolerance: tol(0) },
    { id: 'L2', kind: 'shunt-l', value: 3.55e-10, tolerance: tol(1) },
    { id: 'L3', kind: 'series-l', value: 5.2e-10, tolerance: tol(2) },
    { id: 'C1', kind: 'shunt-c', value: 4.97e-12, tolerance: tol(3) },
  ]);

describe('yieldRun', () => {
  it('yieldRun with a fixed seed is reproducible, and another seed gives other numbers (common practice)', () => {
    const d = ladder(() => ({ relative: 0.1 }));
    const a = yieldRun(d, { trials: 400, seed: 7 });
    const b = yieldRun(d, { trials: 400, seed: 7 });
    const c = yieldRun(d, { trials: 400, seed: 8 });
    expect(b).toEqual(a);
    expect(c.worstVswr).not.toEqual(a.worstVswr);
    expect(a.worstVswr.p50).toBeLessThanOrEqual(a.worstVswr.p95);
    expect(a.worstVswr.p95).toBeLessThanOrEqual(a.worstVswr.max);
    expect(a.passFraction).toBeGreaterThan(0);
    expect(a.passFraction).toBeLessThan(1);
    expect(a.histogram.counts.reduce((s, n) => s + n, 0) + a.histogram.beyond).toBe(400);
  });

  it('yieldRun with zero tolerance gives pass fraction 0 or 1, the nominal figure, and an envelope equal to analyze()’s |Γ| (common practice)', () => {
    for (const d of [ladder(() => ({ relative: 0 })), ladder(() => undefined)]) {
      const r = yieldRun(d, { trials: 50, seed: 1 });
      const a = analyze(d);
      const nominalWorst = (a.worstInBand.vswr - 1) / (a.worstInBand.vswr + 1);
      expect([0, 1]).toContain(r.passFraction);
      expect(r.passFraction).toBe(nominalWorst <= 1 / 3 ? 1 : 0);
      expect(r.worstGamma.max).toBeCloseTo(nominalWorst, 12);
      expect(r.worstGamma.p50).toBe(r.worstGamma.max);
      for (let i = 0; i < a.frequenciesHz.length; i++) {
        expect(r.envelope!.minGamma[i]).toBeCloseTo(a.gammaMagnitude[i], 12);
        expect(r.envelope!.maxGamma[i]).toBeCloseTo(a.gammaMagnitude[i], 12);
      }
    }
    // a chain that fails its goal fails in every trial
    const bad = designOf([{ id: 'L1', kind: 'series-l', value: 1e-9, tolerance: { relative: 0 } }]);
    expect(yieldRun(bad, { trials: 20 }).passFraction).toBe(0);
  });

  it('elementDrawn: a uniform ±t stays within ±t and spreads over it; a normal one (t = 3σ) stays within t in 99.7 % (CONTRACT §2; common practice)', () => {
    const p = prngFrom(5);
    const u: Element = { id: 'L1', kind: 'series-l', value: 1e-9, tolerance: { relative: 0.05 } };
    const nrm: Element = { id: 'C1', kind: 'shunt-c', value: 1e-12, tolerance: { absolute: 0.1e-12, distribution: 'normal' } };
    let lo = Infinity, hi = -Infinity, inside = 0;
    for (let i = 0; i < 20000; i++) {
      const v = (elementDrawn(u, p) as { value: number }).value;
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
      if (Math.abs((elementDrawn(nrm, p) as { value: number }).value - 1e-12) <= 0.1e-12) inside++;
    }
    expect(lo).toBeGreaterThanOrEqual(0.95e-9);
    expect(hi).toBeLessThanOrEqual(1.05e-9);
    expect(lo).toBeLessThan(0.951e-9);
    expect(hi).toBeGreaterThan(1.049e-9);
    expect(inside / 20000).toBeCloseTo(0.9973, 2);
    const line: Element = { id: 'TL1', kind: 'line', z0: 50, length: { degrees: 90, atHz: 1e9 }, tolerance: { absolute: 2 } };
    const drawn = elementDrawn(line, p) as Extract<Element, { kind: 'line' }>;
    expect('degrees' in drawn.length && Math.abs(drawn.length.degrees - 90)).toBeLessThanOrEqual(2);
    const d = ladder(() => ({ relative: 0.02, distribution: 'normal' }));
    const r = yieldRun(d, { trials: 300, seed: 5 });
    for (let i = 0; i < r.envelope!.minGamma.length; i++) expect(r.envelope!.minGamma[i]).toBeLessThanOrEqual(r.envelope!.maxGamma[i]);
    expect(r.variedIds).toEqual(['L1', 'L2', 'L3', 'C1']);
  });

  it('yieldRun ranks the part whose tolerance hurts most first (common practice: one-at-a-time sensitivity)', () => {
    const d = ladder((i) => (i === 1 ? { relative: 0.2 } : { relative: 0.005 }));
    const r = yieldRun(d, { trials: 300, seed: 11 });
    expect(r.sensitivity[0].id).toBe('L2');
    expect(r.sensitivity).toHaveLength(4);
    expect(r.sensitivity[0].worstGammaP95).toBeGreaterThan(r.sensitivity[3].worstGammaP95);
  });

  it('yieldRun stops early when asked and reports the trials done (common practice)', () => {
    const d = ladder(() => ({ relative: 0.05 }));
    let calls = 0;
    const r = yieldRun(d, { trials: 5000, seed: 1, shouldStop: () => ++calls >= 2 });
    expect(r.stopped).toBe(true);
    expect(r.trials).toBe(500);
  });

  it('yieldRunAsync is cancelled by an AbortSignal and reports progress; uncancelled it equals yieldRun (common practice)', async () => {
    const d = ladder(() => ({ relative: 0.05 }));
    const ac = new AbortController();
    const seen: number[] = [];
    const r = await yieldRunAsync(d, {
      trials: 1_000_000,
      seed: 3,
      signal: ac.signal,
      sliceMs: 1,
      onProgress: (p) => {
        seen.push(p.trialsDone);
        if (p.trialsDone >= 1000) ac.abort();
      },
    });
    expect(r.stopped).toBe(true);
    expect(r.trials).toBeLessThan(1_000_000);
    expect(seen[0]).toBe(250);
    const a = await yieldRunAsync(d, { trials: 300, seed: 3 });
    expect(a).toEqual(yieldRun(d, { trials: 300, seed: 3 }));
  });

  it('yieldRun rejects bad options and percentileSorted interpolates (type 7; common practice)', () => {
    const d = ladder(() => ({ relative: 0.05 }));
    expect(() => yieldRun(d, { trials: 0 })).toThrow(YieldOptionError);
    expect(() => yieldRun(d, { trials: 1.5 })).toThrow(YieldOptionError);
    expect(() => yieldRun(d, { seed: Number.NaN })).toThrow(YieldOptionError);
    expect(percentileSorted([1, 2, 3, 4], 0.5)).toBe(2.5);
    expect(percentileSorted([1, 2, 3, 4, 5], 0.95)).toBeCloseTo(4.8, 12);
  });
});
