import { describe, expect, it } from 'vitest';
import { reflectionFromImpedance, complexAbs } from '../../shared/rf/complex';
import { gammaFromVswr, mismatchLossDbFromGamma, returnLossDbFromGamma, vswrFromGamma } from '../../shared/rf/figures';

describe('reflection figures', () => {
  // Standard VSWR / return-loss / mismatch-loss conversion table values (common practice).
  const table: [vswr: number, gamma: number, returnLossDb: number, mismatchLossDb: number][] = [
    [1.5, 0.2, 13.979, 0.1773],
    [2.0, 1 / 3, 9.542, 0.5115],
    [3.0, 0.5, 6.021, 1.2494],
  ];
  for (const [s, g, rl, ml] of table) {
    it(`vswrFromGamma(${g.toFixed(3)}) is ${s}, return loss ${rl} dB, mismatch loss ${ml} dB (common practice tables)`, () => {
      expect(vswrFromGamma(g)).toBeCloseTo(s, 12);
      expect(gammaFromVswr(s)).toBeCloseTo(g, 12);
      expect(returnLossDbFromGamma(g)).toBeCloseTo(rl, 3);
      expect(mismatchLossDbFromGamma(g)).toBeCloseTo(ml, 4);
    });
  }

  it('reflectionFromImpedance: 25+j50 Ω on 50 Ω has |Γ| ≈ 0.62, 45+j10 Ω ≈ 0.12 (common practice)', () => {
    expect(complexAbs(reflectionFromImpedance([25, 50], [50, 0]))).toBeCloseTo(0.62, 2);
    expect(complexAbs(reflectionFromImpedance([45, 10], [50, 0]))).toBeCloseTo(0.117, 3);
  });

  it('reflectionFromImpedance: a conjugate match gives Γ = 0 with the power-wave definition (CONTRACT §1; Kurokawa 1965, from memory)', () => {
    const g = reflectionFromImpedance([30, -20], [30, 20]);
    expect(complexAbs(g)).toBeLessThan(1e-15);
    // ... and a plain (non-conjugate) match does not.
    expect(complexAbs(reflectionFromImpedance([30, 20], [30, 20]))).toBeGreaterThan(0.1);
  });

  it('edge conventions: VSWR and mismatch loss are infinite at |Γ| = 1, return loss is capped at 300 dB at |Γ| = 0 (engine convention)', () => {
    expect(vswrFromGamma(1)).toBe(Infinity);
    expect(mismatchLossDbFromGamma(1)).toBe(Infinity);
    expect(returnLossDbFromGamma(1)).toBe(-0);
    expect(returnLossDbFromGamma(0)).toBeCloseTo(300, 12);
    expect(vswrFromGamma(0)).toBe(1);
  });
});
