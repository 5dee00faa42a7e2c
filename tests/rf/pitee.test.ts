import { describe, expect, it } from 'vitest';
import { piNetworks, piTeeMinimumQ, teeNetworks } from '../../shared/rf/pitee';
import type { ReactiveStep } from '../../shared/rf/match-steps';
import type { Complex } from '../../shared/rf/design';

function applySteps(z: Complex, steps: readonly ReactiveStep[]): Complex {
  let [r, x] = z;
  for (const s of steps) {
    if (s.place === 'series') x += s.x;
    else {
      const m = r * r + x * x;
      const g = r / m;
      const b = -x / m + s.b;
      const n = g * g + b * b;
      r = g / n;
      x = -b / n;
    }
  }
  return [r, x];
}

describe('pi and tee networks', () => {
  it('piNetworks(10 Ω → 50 Ω, Q = 5) has R_v = 50/26 Ω and four exact sign combinations (common practice: R_v = R_high/(1 + Q²))', () => {
    const sols = piNetworks([10, 0], [50, 0], 5);
    expect(sols).toHaveLength(4);
    for (const s of sols) {
      expect(s.virtualOhms).toBeCloseTo(50 / 26, 12);
      expect(s.steps.map((st) => st.place)).toEqual(['shunt', 'series', 'shunt']);
      const z = applySteps([10, 0], s.steps);
      expect(z[0]).toBeCloseTo(50, 9);
      expect(z[1]).toBeCloseTo(0, 9);
    }
    // the port-side shunt of a pi has |B| = Q/R_high (common practice)
    for (const s of sols) expect(Math.abs((s.steps[2] as { b: number }).b)).toBeCloseTo(5 / 50, 12);
  });

  it('teeNetworks(10 + j5 → 50 Ω, Q = 5) has R_v = 10·26 Ω and four exact combinations (common practice: R_v = R_low(1 + Q²))', () => {
    const sols = teeNetworks([10, 5], [50, 0], 5);
    expect(sols).toHaveLength(4);
    for (const s of sols) {
      expect(s.virtualOhms).toBeCloseTo(260, 9);
      const z = applySteps([10, 5], s.steps);
      expect(z[0]).toBeCloseTo(50, 9);
      expect(z[1]).toBeCloseTo(0, 9);
    }
  });

  it('pi and tee networks are empty below the minimum Q (that of an L-section, √(R_high/R_low − 1); common practice)', () => {
    expect(piTeeMinimumQ('pi', [10, 0], [50, 0])).toBeCloseTo(2, 12);
    expect(piNetworks([10, 0], [50, 0], 1.9)).toEqual([]);
    expect(teeNetworks([10, 0], [50, 0], 1.9)).toEqual([]);
    expect(piNetworks([10, 0], [50, 0], 2.1)).toHaveLength(4);
  });

  it('piNetworks reaches a complex target (common practice)', () => {
    for (const s of piNetworks([20, -35], [40, 15], 6)) {
      const z = applySteps([20, -35], s.steps);
      expect(z[0]).toBeCloseTo(40, 9);
      expect(z[1]).toBeCloseTo(15, 9);
    }
  });
});
