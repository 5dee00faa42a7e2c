import { describe, expect, it } from 'vitest';
import {
  binomialFractionalBandwidth,
  binomialSectionImpedances,
  chebyshevFractionalBandwidth,
  chebyshevSecThetaM,
  chebyshevSectionImpedances,
  chebyshevT,
  quarterWaveFractionalBandwidth,
  quarterWaveImpedance,
  realizingLines,
} from '../../shared/rf/transformers';

type C = [number, number];
const mul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
const div = (a: C, b: C): C => {
  const m = b[0] * b[0] + b[1] * b[1];
  return [(a[0] * b[0] + a[1] * b[1]) / m, (a[1] * b[0] - a[0] * b[1]) / m];
};
const add = (a: C, b: C): C => [a[0] + b[0], a[1] + b[1]];
/** Input impedance of lossless sections (listed load -> source) at electrical length θ each (common practice). */
function zinOf(zl: C, sectionsFromLoad: readonly number[], theta: number): C {
  let z = zl;
  const t = Math.tan(theta);
  for (const z0 of sectionsFromLoad) z = mul([z0, 0], div(add(z, [0, z0 * t]), add([z0, 0], mul([0, t], z))));
  return z;
}
const gammaOf = (z: C, z0: number) => Math.hypot(...div(add(z, [-z0, 0]), add(z, [z0, 0])));

describe('quarter-wave transformer', () => {
  it('quarterWaveImpedance(50, 100) = 70.71 Ω (common practice: √(Z0·R_L))', () => {
    expect(quarterWaveImpedance(50, 100)).toBeCloseTo(70.7107, 4);
  });
  it('quarterWaveFractionalBandwidth agrees with the exact response edge (Pozar §5.4, from memory)', () => {
    const bw = quarterWaveFractionalBandwidth(50, 10, 0.1);
    const z1 = quarterWaveImpedance(50, 10);
    const theta = (Math.PI / 2) * (1 - bw / 2);
    expect(gammaOf(zinOf([10, 0], [z1], theta), 50)).toBeCloseTo(0.1, 9);
  });
  it('realizingLines(100 + j50 on 50 Ω) gives R_max and R_min a quarter wave apart (common practice)', () => {
    const lines = realizingLines([100, 50], 50);
    expect(lines).toHaveLength(2);
    expect(lines[1].degrees - lines[0].degrees).toBeCloseTo(90, 9);
    for (const l of lines) {
      const z = zinOf([100, 50], [50], (l.degrees * Math.PI) / 180);
      expect(z[0]).toBeCloseTo(l.resistance, 9);
      expect(z[1]).toBeCloseTo(0, 9);
    }
    expect(lines.find((l) => l.kind === 'maximum')!.resistance * lines.find((l) => l.kind === 'minimum')!.resistance).toBeCloseTo(2500, 6);
  });
});

describe('binomial transformer', () => {
  it('binomialSectionImpedances(100 → 50 Ω, N = 3) gives 91.7, 70.7, 54.5 Ω and 70 % bandwidth at Γm = 0.05', () => {
    // Pozar, Microwave Engineering, Example 5.6 (from memory)
    const z = binomialSectionImpedances(100, 50, 3);
    expect(z[0]).toBeCloseTo(91.7, 1);
    expect(z[1]).toBeCloseTo(70.7, 1);
    expect(z[2]).toBeCloseTo(54.5, 1);
    expect(binomialFractionalBandwidth(100, 50, 3, 0.05)).toBeCloseTo(0.70, 2);
  });
  it('binomialSectionImpedances matches exactly at the centre and follows 2^N·|A|·|cos θ|^N off it (Pozar §5.6, from memory)', () => {
    for (const n of [1, 2, 3, 4, 5]) {
      const z = binomialSectionImpedances(50, 100, n);
      const fromLoad = [...z].reverse();
      expect(gammaOf(zinOf([100, 0], fromLoad, Math.PI / 2), 50)).toBeLessThan(1e-12);
      const a = Math.pow(2, -(n + 1)) * Math.log(2);
      for (const theta of [Math.PI / 4, Math.PI / 3]) {
        const exact = gammaOf(zinOf([100, 0], fromLoad, theta), 50);
        expect(Math.abs(exact / (Math.pow(2, n) * a * Math.pow(Math.cos(theta), n)) - 1)).toBeLessThan(0.05);
      }
    }
  });
});

describe('Chebyshev transformer', () => {
  it('chebyshevSectionImpedances(50 → 100 Ω, N = 3, Γm = 0.05) gives 57.4, 70.7, 87.2 Ω and 101 % bandwidth', () => {
    // Pozar, Microwave Engineering, Example 5.7 (from memory): sec θm = 1.408, θm = 44.7°, the table's
    // exact Z = 57.37, 70.71, 87.15 Ω; the small-reflection theory used here lands within 0.3 % of them.
    expect(chebyshevSecThetaM(50, 100, 3, 0.05)).toBeCloseTo(1.408, 3);
    const z = chebyshevSectionImpedances(50, 100, 3, 0.05)!;
    expect(Math.abs(z[0] / 57.37 - 1)).toBeLessThan(0.005);
    expect(Math.abs(z[1] / 70.71 - 1)).toBeLessThan(0.001);
    expect(Math.abs(z[2] / 87.15 - 1)).toBeLessThan(0.005);
    expect(chebyshevFractionalBandwidth(50, 100, 3, 0.05, 0.05)).toBeCloseTo(1.01, 2);
  });
  it('chebyshevSectionImpedances: the exact response ripples near Γm across the band and stays under it outside the edges (common practice)', () => {
    for (const n of [3, 5]) {
      const ripple = 0.05;
      const z = chebyshevSectionImpedances(50, 100, n, ripple)!;
      const fromLoad = [...z].reverse();
      expect(gammaOf(zinOf([100, 0], fromLoad, Math.PI / 2), 50)).toBeLessThan(1e-12);
      const bw = chebyshevFractionalBandwidth(50, 100, n, ripple, ripple)!;
      let worst = 0;
      for (let i = 0; i <= 200; i++) {
        const f = 1 - bw / 2 + (bw * i) / 200;
        worst = Math.max(worst, gammaOf(zinOf([100, 0], fromLoad, (Math.PI / 2) * f), 50));
      }
      expect(worst).toBeGreaterThan(ripple * 0.9);
      expect(worst).toBeLessThan(ripple * 1.1);
    }
  });
  it('chebyshevSectionImpedances is null when the ends are within the ripple already (common practice)', () => {
    expect(chebyshevSectionImpedances(50, 52, 3, 0.05)).toBeNull();
  });
  it('chebyshevT(3, x) = 4x³ − 3x inside and outside [−1, 1] (common practice)', () => {
    for (const x of [-2, -0.7, 0, 0.3, 1.5]) expect(chebyshevT(3, x)).toBeCloseTo(4 * x ** 3 - 3 * x, 10);
    expect(chebyshevT(4, -1.3)).toBeCloseTo(8 * 1.3 ** 4 - 8 * 1.3 ** 2 + 1, 10);
  });
});
