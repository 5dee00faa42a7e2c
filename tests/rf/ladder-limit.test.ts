import { describe, expect, it } from 'vitest';
import { analyze } from '../../shared/rf/index';
import { parseDesign } from '../../shared/rf/design';
import { refineDesign } from '../../shared/rf/refine';
import {
  bodeFanoDecrement,
  ladderBestGamma,
  ladderLimit,
  ladderLimitForDesign,
  ladderLimitFromBodeFano,
  prototypeMinimumDecrement,
  prototypeMinimumGamma,
} from '../../shared/rf/ladder-limit';

/** Brute-force minimax of a parallel RC (R = 1, ωc·R·C = 1/δ) behind an ideal transformer of resistance level r, over 0..ωc. */
function bruteForceOrderOne(delta: number): number {
  let best = Infinity;
  for (let k = 0; k <= 4000; k++) {
    const r = Math.exp(-2 + (4 * k) / 4000);
    let worst = 0;
    for (let i = 0; i <= 400; i++) {
      const x = i / 400 / delta; // ωRC
      // Z = 1/(1 + jx); Γ = (Z − r)/(Z + r)
      const d = 1 + x * x;
      const zr = 1 / d, zi = -x / d;
      const g = Math.hypot(zr - r, zi) / Math.hypot(zr + r, zi);
      worst = Math.max(worst, g);
    }
    best = Math.min(best, worst);
  }
  return best;
}

describe('ladder limit', () => {
  it('prototypeMinimumGamma(1, δ) equals a brute-force minimax of an RC load behind a transformer (common practice: direct computation)', () => {
    for (const delta of [0.5, 1, 2]) expect(prototypeMinimumGamma(1, delta)).toBeCloseTo(bruteForceOrderOne(delta), 3);
  });

  it('prototypeMinimumDecrement tends to the Bode–Fano decrement ln(1/Γm)/π as the order grows, from below in bandwidth (Bode–Fano; Pozar §5.9, from memory)', () => {
    const g = 1 / 3;
    const bf = bodeFanoDecrement(g);
    let prev = Infinity;
    for (const n of [1, 2, 3, 5, 10, 40]) {
      const d = prototypeMinimumDecrement(n, g).decrement;
      expect(d).toBeGreaterThan(bf);
      expect(d).toBeLessThan(prev);
      prev = d;
    }
    expect(prototypeMinimumDecrement(200, g).decrement / bf).toBeCloseTo(1, 2);
  });

  it('prototypeMinimumGamma and prototypeMinimumDecrement are inverse (common practice)', () => {
    for (const n of [1, 2, 4]) {
      const s = prototypeMinimumDecrement(n, 0.2);
      expect(prototypeMinimumGamma(n, s.decrement)).toBeCloseTo(0.2, 6);
    }
  });

  it('ladderLimit rows rise with the order and stay below the Bode–Fano bound π/(Q ln(1/Γm)) (Bode–Fano; Pozar §5.9, from memory)', () => {
    const q = 6, g = 1 / 3;
    const l = ladderLimit(q, g, 6);
    expect(l.bodeFanoFractional).toBeCloseTo(Math.PI / (q * Math.log(3)), 12);
    for (let i = 0; i < l.rows.length; i++) {
      expect(l.rows[i].ofBodeFano).toBeLessThan(1);
      if (i) expect(l.rows[i].maxFractional).toBeGreaterThan(l.rows[i - 1].maxFractional);
      expect(l.rows[i].parts).toBe(2 * l.rows[i].order);
      expect(ladderBestGamma(q, l.rows[i].maxFractional, l.rows[i].order)).toBeCloseTo(g, 6);
    }
  });

  it('ladderLimitForDesign uses the analysis core’s load fit: its Bode–Fano figure equals analyze().limit.maxFractional (common practice)', () => {
    const d = parseDesign({
      format: 'matchloom-design',
      version: 1,
      load: { kind: 'rlc', topology: 'parallel', r: 200, c: 2e-12 },
      band: { startHz: 2.3e9, stopHz: 2.6e9, centerHz: 2.44e9 },
      sweep: { startHz: 2e9, stopHz: 3e9, points: 51 },
      goal: { maxVswr: 2 },
      elements: [],
    });
    const gauge = ladderLimitForDesign(d)!;
    const limit = analyze(d).limit!;
    expect(gauge.model).toBe('parallel-rc');
    expect(gauge.bodeFanoFractional).toBeCloseTo(limit.maxFractional, 9);
    expect(gauge.loadQ).toBeCloseTo(2 * Math.PI * 2.44e9 * 200 * 2e-12, 6);
    expect(ladderLimitFromBodeFano(limit.maxFractional, 1 / 3).rows[1].maxFractional).toBeCloseTo(gauge.rows[1].maxFractional, 9);
  });

  it('ladderBestGamma(order 2) is what refine reaches with a 4-part band-pass ladder on 200 Ω ∥ 2 pF over 20 % (numerical check, within 3 %)', () => {
    const d = parseDesign({
      format: 'matchloom-design',
      version: 1,
      load: { kind: 'rlc', topology: 'parallel', r: 200, c: 2e-12 },
      band: { startHz: 2.2e9, stopHz: 2.7e9, centerHz: 2.44e9 },
      sweep: { startHz: 1.8e9, stopHz: 3.1e9, points: 201 },
      goal: { maxVswr: 2 },
      elements: [
        { id: 'L1', kind: 'series-l', value: 2e-9 },
        { id: 'L2', kind: 'shunt-l', value: 0.4e-9 },
        { id: 'L3', kind: 'series-l', value: 1e-9 },
        { id: 'C1', kind: 'shunt-c', value: 1e-12 },
      ],
    });
    const gauge = ladderBestGamma(2 * Math.PI * 2.44e9 * 200 * 2e-12, 0.5 / 2.44, 2);
    const refined = refineDesign(d).worstInBand.gamma;
    expect(Math.abs(refined / gauge - 1)).toBeLessThan(0.03);
  });
});
