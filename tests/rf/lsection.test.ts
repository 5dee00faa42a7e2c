import { describe, expect, it } from 'vitest';
import { lSections, lSectionsSeriesAtLoad, lSectionsShuntAtLoad } from '../../shared/rf/lsection';
import { reactiveStepElement, type ReactiveStep } from '../../shared/rf/match-steps';
import type { Complex } from '../../shared/rf/design';

/** Impedance after applying steps (load -> port) to a load, plain complex arithmetic. */
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

const close = (a: number, b: number, rel = 1e-9) => Math.abs(a - b) <= rel * Math.max(1, Math.abs(b));

describe('lSections', () => {
  it('lSectionsShuntAtLoad(200 − j100 → 100 Ω) gives the two worked solutions', () => {
    // Pozar, Microwave Engineering, Example 5.1 (from memory): 500 MHz, solutions
    // C = 0.92 pF shunt + L = 38.8 nH series, and L = 46.1 nH shunt + C = 2.61 pF series.
    const omega = 2 * Math.PI * 500e6;
    const sols = lSectionsShuntAtLoad([200, -100], [100, 0]);
    expect(sols).toHaveLength(2);
    const elements = sols.map((s) => s.steps.map((st) => reactiveStepElement(st, omega)));
    const byFirst = new Map(elements.map((e) => [e[0].kind, e]));
    const a = byFirst.get('shunt-c')!;
    expect(a[0].value).toBeCloseTo(0.922e-12, 14);
    expect(a[1].kind).toBe('series-l');
    expect(a[1].value * 1e9).toBeCloseTo(38.9, 0);
    const b = byFirst.get('shunt-l')!;
    expect(b[0].value * 1e9).toBeCloseTo(46.1, 1);
    expect(b[1].kind).toBe('series-c');
    expect(b[1].value * 1e12).toBeCloseTo(2.6, 1);
    // the normalised susceptances 0.2899 and −0.6899 (same example, from memory)
    const bs = sols.map((s) => (s.steps[0] as { b: number }).b * 100).sort((p, q) => p - q);
    expect(bs[0]).toBeCloseTo(-0.6899, 3);
    expect(bs[1]).toBeCloseTo(0.2899, 3);
  });

  it('lSectionsSeriesAtLoad(200 − j100 → 100 Ω) is empty: R_L > Z0 (Pozar §5.1, from memory)', () => {
    expect(lSectionsSeriesAtLoad([200, -100], [100, 0])).toEqual([]);
  });

  it('lSections of 20 + j60 Ω to 50 Ω has four solutions, all exact (R² + X² ≥ Z0·R and R < Z0; common practice)', () => {
    const sols = lSections([20, 60], [50, 0]);
    expect(sols).toHaveLength(4);
    for (const s of sols) {
      const z = applySteps([20, 60], s.steps);
      expect(close(z[0], 50)).toBe(true);
      expect(Math.abs(z[1])).toBeLessThan(1e-9);
    }
  });

  it('lSectionsShuntAtLoad applies when R > Z0 is false but R² + X² ≥ Z0·R (10 + j40 to 50; common practice)', () => {
    // 10 < 50, yet 100 + 1600 = 1700 ≥ 500: the shunt-first form exists.
    const sols = lSectionsShuntAtLoad([10, 40], [50, 0]);
    expect(sols).toHaveLength(2);
    for (const s of sols) {
      const z = applySteps([10, 40], s.steps);
      expect(close(z[0], 50)).toBe(true);
      expect(Math.abs(z[1])).toBeLessThan(1e-9);
    }
  });

  it('lSections of 50 + j30 to 50 Ω degenerates to one series element (common practice)', () => {
    const sols = lSections([50, 30], [50, 0]);
    expect(sols.length).toBeGreaterThan(0);
    const single = sols.filter((s) => s.steps.length === 1);
    expect(single.length).toBeGreaterThan(0);
    for (const s of single) {
      expect(s.steps[0].place).toBe('series');
      expect((s.steps[0] as { x: number }).x).toBeCloseTo(-30, 9);
    }
  });

  it('lSections reaches a complex target Zs* (common practice: conjugate match)', () => {
    const target: Complex = [30, -20];
    const sols = lSections([75, 40], target);
    expect(sols.length).toBeGreaterThan(0);
    for (const s of sols) {
      const z = applySteps([75, 40], s.steps);
      expect(close(z[0], 30)).toBe(true);
      expect(close(z[1], -20)).toBe(true);
    }
  });

  it('lSections of a pure reactance or a short is empty (no lossless match; common practice)', () => {
    expect(lSections([0, 25], [50, 0])).toEqual([]);
    expect(lSections([0, 0], [50, 0])).toEqual([]);
  });
});
