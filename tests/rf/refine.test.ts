import { describe, expect, it } from 'vitest';
import { analyze } from '../../shared/rf/index';
import { parseDesign, type Design, type DesignInput, type Element } from '../../shared/rf/design';
import { refineDesign, refineDesignAsync, refineSteps, type RefineProgress } from '../../shared/rf/refine';
import { prototypeMinimumGamma } from '../../shared/rf/ladder-limit';
import { lSections } from '../../shared/rf/lsection';
import { reactiveStepElement } from '../../shared/rf/match-steps';
import { isPreferred } from '../../shared/rf/eseries';
import { prngFrom, prngUniform } from '../../shared/rf/prng';

const FC = 1e9;
function designOf(load: DesignInput['load'], elements: DesignInput['elements'], extra: Partial<DesignInput> = {}): Design {
  return parseDesign({
    format: 'matchloom-design',
    version: 1,
    referenceOhms: 50,
    load,
    band: { startHz: 0.9 * FC, stopHz: 1.1 * FC, centerHz: FC },
    sweep: { startHz: 0.8 * FC, stopHz: 1.2 * FC, points: 41 },
    goal: { maxVswr: 2 },
    elements,
    ...extra,
  });
}
/** Worst in-band |Γ| by the analysis core (from its worst VSWR). */
function analysedWorst(d: Design): number {
  const v = analyze(d).worstInBand.vswr;
  return (v - 1) / (v + 1);
}

describe('refineDesign', () => {
  it('refineDesign never returns a design worse than its input, by analyze() (20 seeded random chains; common practice)', () => {
    const prng = prngFrom(42);
    const kinds = ['series-l', 'series-c', 'shunt-l', 'shunt-c'] as const;
    for (let k = 0; k < 20; k++) {
      const elements: Element[] = [];
      for (let i = 0; i < 1 + (k % 3); i++) {
        const kind = kinds[Math.floor(prngUniform(prng) * 4)];
        const value = kind.endsWith('-l') ? 1e-9 * Math.exp(prngUniform(prng) * 4) : 1e-12 * Math.exp(prngUniform(prng) * 4);
        elements.push({ id: `E${i}`, kind, value } as Element);
      }
      if (k % 4 === 0) elements.push({ id: 'TL', kind: 'line', z0: 50, length: { degrees: 30, atHz: FC } });
      const d = designOf({ kind: 'impedance', ohms: [5 + prngUniform(prng) * 200, (prngUniform(prng) - 0.5) * 300] }, elements);
      const r = refineDesign(d, { maxEvaluations: 600, seed: k });
      expect(analysedWorst(r.design)).toBeLessThanOrEqual(analysedWorst(d) + 1e-12);
      expect(r.worstInBand.gamma).toBeCloseTo(analysedWorst(r.design), 9);
      expect(r.worstInBand.gamma).toBeLessThanOrEqual(r.initialWorstGamma);
    }
  });

  it('refineDesign returns the input unchanged when nothing can be tuned (all locked; common practice)', () => {
    const d = designOf({ kind: 'impedance', ohms: [20, 10] }, [
      { id: 'L1', kind: 'series-l', value: 3e-9, locked: true },
      { id: 'C1', kind: 'shunt-c', value: 4e-12, locked: true },
    ]);
    const r = refineDesign(d);
    expect(r.improved).toBe(false);
    expect(r.design.elements).toEqual(d.elements);
    expect(r.iterations).toBe(0);
  });

  it('refineDesign leaves locked elements exactly as they are and keeps lengths within 0–180° (common practice)', () => {
    const d = designOf({ kind: 'impedance', ohms: [12, -30] }, [
      { id: 'TL1', kind: 'line', z0: 50, length: { degrees: 40, atHz: FC } },
      { id: 'C1', kind: 'shunt-c', value: 2e-12, locked: true },
      { id: 'ST1', kind: 'short-stub', z0: 50, length: { meters: 0.05, velocityFactor: 0.7 } },
    ]);
    const r = refineDesign(d, { maxEvaluations: 1500 });
    expect(r.improved).toBe(true);
    expect(r.design.elements[1]).toEqual(d.elements[1]);
    const line = r.design.elements[0] as Extract<Element, { kind: 'line' }>;
    expect('degrees' in line.length && line.length.degrees).toBeGreaterThanOrEqual(0);
    expect('degrees' in line.length && line.length.degrees).toBeLessThanOrEqual(180);
    const stub = r.design.elements[2] as Extract<Element, { kind: 'short-stub' }>;
    expect('meters' in stub.length).toBe(true); // the length keeps its form
  });

  it('refineDesign finds the exact L-section from a detuned start over a narrow band (Pozar, Microwave Engineering, Example 5.1 load, from memory)', () => {
    const omega = 2 * Math.PI * FC;
    const sol = lSections([200, -100], [100, 0])[0];
    const exact = sol.steps.map((s, i) => ({ id: `E${i}`, ...reactiveStepElement(s, omega) }) as Element);
    const detuned = exact.map((e) => ({ ...e, value: (e as { value: number }).value * 1.3 }) as Element);
    const d = designOf({ kind: 'impedance', ohms: [200, -100] }, detuned, {
      referenceOhms: 100,
      band: { startHz: FC * 0.9999, stopHz: FC * 1.0001, centerHz: FC },
      sweep: { startHz: FC * 0.999, stopHz: FC * 1.001, points: 3 },
    });
    const r = refineDesign(d);
    expect(r.worstInBand.gamma).toBeLessThan(1e-4);
    r.design.elements.forEach((e, i) => expect((e as { value: number }).value / (exact[i] as { value: number }).value).toBeCloseTo(1, 3));
  });

  it('refineDesign reaches Fano’s equal-ripple optimum for an RC load behind an ideal transformer (n = 1: √2 − 1) and a series L (n = 2: (√2 − 1)²)', () => {
    // Fano, J. Franklin Inst. 1950 / Matthaei, Young & Jones §4.09 (from memory), low-pass, decrement 1/(ωc·R·C) = 1.
    const fc = 1e9;
    const load = { kind: 'rlc' as const, topology: 'parallel' as const, r: 50, c: 1 / (2 * Math.PI * fc * 50) };
    const extra = { band: { startHz: 1e3, stopHz: fc, centerHz: fc / 2 }, sweep: { startHz: 1e3, stopHz: fc, points: 201 } };
    const one = refineDesign(designOf(load, [{ id: 'T1', kind: 'transformer', ratio: 1 }], extra));
    expect(one.worstInBand.gamma).toBeCloseTo(Math.SQRT2 - 1, 5);
    expect(prototypeMinimumGamma(1, 1)).toBeCloseTo(Math.SQRT2 - 1, 9);
    const two = refineDesign(designOf(load, [{ id: 'L1', kind: 'series-l', value: 5e-9 }, { id: 'T1', kind: 'transformer', ratio: 1 }], extra));
    expect(two.worstInBand.gamma).toBeCloseTo((Math.SQRT2 - 1) ** 2, 4);
    expect(prototypeMinimumGamma(2, 1)).toBeCloseTo((Math.SQRT2 - 1) ** 2, 9);
  });

  it('refineDesign reports progress with a non-increasing best and stops when shouldStop says so (common practice)', () => {
    const d = designOf({ kind: 'rlc', topology: 'parallel', r: 200, c: 2e-12 }, [
      { id: 'L1', kind: 'series-l', value: 2e-9 },
      { id: 'L2', kind: 'shunt-l', value: 1e-9 },
    ]);
    const seen: RefineProgress[] = [];
    const r = refineDesign(d, { onProgress: (p) => seen.push(p), shouldStop: () => seen.length >= 10 });
    expect(r.stopped).toBe(true);
    expect(seen.length).toBe(10);
    for (let i = 1; i < seen.length; i++) {
      expect(seen[i].iteration).toBeGreaterThan(seen[i - 1].iteration);
      expect(seen[i].worstGamma).toBeLessThanOrEqual(seen[i - 1].worstGamma);
    }
    expect(r.worstInBand.gamma).toBeLessThanOrEqual(r.initialWorstGamma);
    // the generator form gives the same result as the synchronous run
    const run = refineSteps(d, { maxEvaluations: 300 });
    let step = run.next();
    while (!step.done) step = run.next();
    expect(step.value.worstInBand.gamma).toBe(refineDesign(d, { maxEvaluations: 300 }).worstInBand.gamma);
  });

  it('refineDesignAsync can be cancelled by an AbortSignal and still returns the best design so far (common practice)', async () => {
    const d = designOf({ kind: 'rlc', topology: 'parallel', r: 200, c: 2e-12 }, [
      { id: 'L1', kind: 'series-l', value: 2e-9 },
      { id: 'L2', kind: 'shunt-l', value: 1e-9 },
      { id: 'L3', kind: 'series-l', value: 1e-9 },
      { id: 'C1', kind: 'shunt-c', value: 1e-12 },
    ]);
    const ac = new AbortController();
    const progress: number[] = [];
    setTimeout(() => ac.abort(), 5);
    const r = await refineDesignAsync(d, { signal: ac.signal, maxEvaluations: 10_000_000, sliceMs: 1, onProgress: (p) => progress.push(p.worstGamma) });
    expect(r.stopped).toBe(true);
    expect(r.evaluations).toBeLessThan(10_000_000);
    expect(r.worstInBand.gamma).toBeLessThanOrEqual(r.initialWorstGamma);
  });

  it('refineDesign with snap puts every free L and C on the E-series and re-refines the rest (common practice)', () => {
    const d = designOf({ kind: 'impedance', ohms: [15, 20] }, [
      { id: 'C1', kind: 'shunt-c', value: 5e-12 },
      { id: 'TL1', kind: 'line', z0: 50, length: { degrees: 20, atHz: FC } },
      { id: 'L1', kind: 'series-l', value: 4e-9 },
      { id: 'C2', kind: 'shunt-c', value: 1.234e-12, locked: true },
    ]);
    const r = refineDesign(d, { snap: 'E12', maxEvaluations: 1500 });
    expect(r.snappedIds).toEqual(['C1', 'L1']);
    for (const id of ['C1', 'L1']) expect(isPreferred((r.design.elements.find((e) => e.id === id) as { value: number }).value, 'E12')).toBe(true);
    expect((r.design.elements[3] as { value: number }).value).toBe(1.234e-12);
    expect(r.worstInBand.gamma).toBeLessThanOrEqual(r.initialWorstGamma);
  });
});
