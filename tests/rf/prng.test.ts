import { describe, expect, it } from 'vitest';
import { prngFrom, prngNextUint32, prngNormal, prngSplit, prngUniform } from '../../shared/rf/prng';

describe('prng (mulberry32)', () => {
  it('prngFrom(seed) gives the same stream for the same seed and a different one for another (common practice)', () => {
    const a = prngFrom(7);
    const b = prngFrom(7);
    const c = prngFrom(8);
    const sa = Array.from({ length: 50 }, () => prngNextUint32(a));
    expect(Array.from({ length: 50 }, () => prngNextUint32(b))).toEqual(sa);
    expect(Array.from({ length: 50 }, () => prngNextUint32(c))).not.toEqual(sa);
    for (const v of sa) expect(Number.isInteger(v) && v >= 0 && v < 2 ** 32).toBe(true);
  });

  it('prngUniform is uniform on [0, 1): mean ½, variance 1/12, and a χ² over 20 bins below the 99.9 % point (common practice)', () => {
    const p = prngFrom(12345);
    const n = 200_000;
    const bins = new Array(20).fill(0);
    let s = 0, s2 = 0, lo = Infinity, hi = -Infinity;
    for (let i = 0; i < n; i++) {
      const u = prngUniform(p);
      lo = Math.min(lo, u);
      hi = Math.max(hi, u);
      s += u;
      s2 += u * u;
      bins[Math.floor(u * 20)]++;
    }
    expect(lo).toBeGreaterThanOrEqual(0);
    expect(hi).toBeLessThan(1);
    expect(s / n).toBeCloseTo(0.5, 2);
    expect(s2 / n - (s / n) ** 2).toBeCloseTo(1 / 12, 3);
    const e = n / 20;
    const chi2 = bins.reduce((acc, o) => acc + (o - e) ** 2 / e, 0);
    expect(chi2).toBeLessThan(43.8); // χ²(19 dof) 99.9 % point
    // successive values are uncorrelated
    const q = prngFrom(99);
    let prev = prngUniform(q), c = 0;
    for (let i = 0; i < n; i++) {
      const u = prngUniform(q);
      c += (u - 0.5) * (prev - 0.5);
      prev = u;
    }
    expect(Math.abs(c / n / (1 / 12))).toBeLessThan(0.01);
  });

  it('prngNormal has mean 0, variance 1 and 99.73 % within ±3σ (Box–Muller; common practice)', () => {
    const p = prngFrom(3);
    const n = 200_000;
    let s = 0, s2 = 0, inside = 0;
    for (let i = 0; i < n; i++) {
      const z = prngNormal(p);
      s += z;
      s2 += z * z;
      if (Math.abs(z) <= 3) inside++;
    }
    expect(s / n).toBeCloseTo(0, 2);
    expect(s2 / n).toBeCloseTo(1, 1);
    expect(inside / n).toBeCloseTo(0.9973, 3);
  });

  it('prngSplit gives distinct, reproducible streams per stream number (common practice)', () => {
    const a = Array.from({ length: 5 }, ((p) => () => prngNextUint32(p))(prngSplit(7, 0)));
    const b = Array.from({ length: 5 }, ((p) => () => prngNextUint32(p))(prngSplit(7, 1)));
    const a2 = Array.from({ length: 5 }, ((p) => () => prngNextUint32(p))(prngSplit(7, 0)));
    expect(a).toEqual(a2);
    expect(a).not.toEqual(b);
  });
});
