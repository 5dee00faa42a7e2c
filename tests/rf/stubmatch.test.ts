import { describe, expect, it } from 'vitest';
import { lineAdmittance, stubDegreesFor, stubLineLengths, stubMatches } from '../../shared/rf/stubmatch';
import type { Complex } from '../../shared/rf/design';

/** Admittance of a lossless stub: open jY tan βl, shorted −jY cot βl (common practice). */
function stubB(kind: 'open-stub' | 'short-stub', deg: number, z0: number): number {
  const t = Math.tan((deg * Math.PI) / 180);
  return kind === 'open-stub' ? t / z0 : -1 / (t * z0);
}

describe('stubMatches', () => {
  it('stubMatches(60 − j80 → 50 Ω) gives the worked shorted-stub tuner', () => {
    // Pozar, Microwave Engineering, Example 5.2 (from memory): d1 = 0.110λ, l1 = 0.095λ;
    // d2 = 0.260λ, l2 = 0.405λ, with short-circuited stubs; B = ±1.47 (normalised) after the line.
    const sols = stubMatches([60, -80], [50, 0], { lineZ0: 50, stubZ0: 50, kinds: ['short-stub'] });
    expect(sols).toHaveLength(2);
    const [a, b] = sols;
    expect(a.lineDegrees / 360).toBeCloseTo(0.110, 2);
    expect(a.stubDegrees / 360).toBeCloseTo(0.095, 3);
    expect(b.lineDegrees / 360).toBeCloseTo(0.260, 2);
    expect(b.stubDegrees / 360).toBeCloseTo(0.405, 3);
    expect(a.stubSusceptance * 50).toBeCloseTo(-1.47, 2);
    expect(b.stubSusceptance * 50).toBeCloseTo(1.47, 2);
  });

  it('stubMatches: every solution brings the admittance to the target, for several line and stub impedances (common practice)', () => {
    const loads: Complex[] = [[60, -80], [10, 30], [150, 75], [25, 0], [5, -2]];
    for (const zl of loads)
      for (const lineZ0 of [50, 35, 75])
        for (const stubZ0 of [50, 100]) {
          const sols = stubMatches(zl, [50, 0], { lineZ0, stubZ0 });
          for (const s of sols) {
            const y = lineAdmittance(zl, lineZ0, s.lineDegrees);
            expect(y[0]).toBeCloseTo(1 / 50, 12);
            const b = s.stubDegrees === 0 ? 0 : stubB(s.stubKind, s.stubDegrees, stubZ0);
            expect(y[1] + b).toBeCloseTo(0, 10);
            expect(s.lineDegrees).toBeGreaterThanOrEqual(0);
            expect(s.lineDegrees).toBeLessThan(180);
            expect(s.stubDegrees).toBeGreaterThanOrEqual(0);
            expect(s.stubDegrees).toBeLessThan(180);
          }
          // a 50 Ω line always reaches the g = 1 circle (Pozar §5.2, from memory)
          if (lineZ0 === 50) expect(sols.length).toBeGreaterThanOrEqual(2);
        }
  });

  it('stubLineLengths has a quarter-wave root when r equals the target conductance (common practice)', () => {
    // z = 1 + j1 on a 50 Ω line: r = g = 1, so t = ∞ (d = 90°) is a root, and the other is t = 0 ... (1 − 2)/(−2) = 0.5
    const ds = stubLineLengths([50, 50], 50, 1 / 50);
    expect(ds).toContain(90);
    expect(ds).toHaveLength(2);
  });

  it('stubMatches of a pure reactance is empty (common practice)', () => {
    expect(stubMatches([0, 40], [50, 0], { lineZ0: 50, stubZ0: 50 })).toEqual([]);
  });

  it('stubDegreesFor: an open stub of 45° gives b·Z = 1 and a shorted one of 135° too (common practice)', () => {
    expect(stubDegreesFor('open-stub', 1 / 50, 50)).toBeCloseTo(45, 12);
    expect(stubDegreesFor('short-stub', 1 / 50, 50)).toBeCloseTo(135, 12);
    expect(stubDegreesFor('short-stub', 0, 50)).toBe(90);
  });
});
