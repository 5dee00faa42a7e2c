import { describe, expect, it } from 'vitest';
import { abcdFromS, sFromAbcd } from '../../shared/rf/abcd';
import { analyze } from '../../shared/rf/analyze';
import { chainZin, gammaFromZin, sweepContext } from '../../shared/rf/cascade';
import { type Complex, type Element } from '../../shared/rf/design';
import { designOf } from './helpers';

const F = 1e9;
const W = 2 * Math.PI * F;

/** Zin at one frequency of a chain on load zl. */
function zinAt(elements: Element[], zl: Complex, hz = F): Complex {
  const d = designOf({ load: { kind: 'impedance', ohms: [Math.max(zl[0], 0), zl[1]] }, sweep: { startHz: hz, stopHz: hz, points: 1 }, elements });
  const ctx = sweepContext(d);
  const z = chainZin(ctx, elements);
  return [z[0], z[1]];
}

function expectComplex(got: Complex, want: Complex, rel = 1e-12) {
  const scale = Math.max(1, Math.hypot(want[0], want[1]));
  expect(Math.hypot(got[0] - want[0], got[1] - want[1]) / scale, `got ${got}, want ${want}`).toBeLessThan(rel);
}

/** Textbook line input impedance Zin = Z0 (ZL + jZ0 tan βl)/(Z0 + jZL tan βl). */
function lineZin(z0: number, zl: Complex, theta: number): Complex {
  const t = Math.tan(theta);
  const nr = zl[0], ni = zl[1] + z0 * t;
  const dr = z0 - zl[1] * t, di = zl[0] * t;
  const d = dr * dr + di * di;
  return [(z0 * (nr * dr + ni * di)) / d, (z0 * (ni * dr - nr * di)) / d];
}

const line = (id: string, z0: number, degrees: number, extra: Partial<Extract<Element, { kind: 'line' }>> = {}): Element => ({
  id,
  kind: 'line',
  z0,
  length: { degrees, atHz: F },
  ...extra,
});

describe('chainZin: transmission lines', () => {
  it('a line of 37° on 20−j30 Ω matches Zin = Z0(ZL + jZ0 tan βl)/(Z0 + jZL tan βl) (Pozar, Microwave Engineering 4th ed., eq. 2.44, from memory)', () => {
    expectComplex(zinAt([line('l', 75, 37)], [20, -30]), lineZin(75, [20, -30], (37 * Math.PI) / 180));
  });

  it('a quarter-wave line gives Zin = Z0²/ZL (Pozar 4th ed., §2.5 quarter-wave transformer)', () => {
    expectComplex(zinAt([line('q', 35.355339059327378, 90)], [25, 0]), [50, 0], 1e-12);
    expectComplex(zinAt([line('q', 50, 90)], [10, 20]), [2500 * (10 / 500), 2500 * (-20 / 500)], 1e-12);
  });

  it('a half-wave line repeats the load, Zin = ZL (Pozar 4th ed., §2.3, from memory)', () => {
    expectComplex(zinAt([line('h', 93, 180)], [17, 42]), [17, 42], 1e-12);
  });

  it('degrees scale with frequency: 90° at 1 GHz is 180° at 2 GHz (CONTRACT §2 LENGTH)', () => {
    expectComplex(zinAt([line('h', 93, 90)], [17, 42], 2e9), [17, 42], 1e-12);
  });

  it('the metres form uses βl = 2πf·l/(v·c): 0.1 m at v = 0.6 is 120° at 1 GHz (common practice)', () => {
    const metres = zinAt([{ id: 'm', kind: 'line', z0: 60, length: { meters: 0.1, velocityFactor: 0.6 } }], [30, 10]);
    const deg = (360 * 0.1 * F) / (0.6 * 299_792_458);
    expectComplex(metres, lineZin(60, [30, 10], (deg * Math.PI) / 180));
  });

  it('a zero-length line is transparent (common practice)', () => {
    expectComplex(zinAt([line('z', 120, 0)], [5, -77]), [5, -77], 1e-15);
  });

  it('a lossy line follows Zin = Z0(ZL + Z0 tanh γl)/(Z0 + ZL tanh γl) (Pozar 4th ed., §2.7 eq. 2.91, from memory)', () => {
    const loss = 8; // dB/m
    const deg = 140;
    const z0 = 50;
    const zl: Complex = [100, 40];
    const metres = (deg / 360) * (299_792_458 / F); // the degrees form's physical length (velocity factor 1)
    const a = ((loss * Math.LN10) / 20) * metres;
    const b = (deg * Math.PI) / 180;
    // tanh(a + jb) = (sinh 2a + j sin 2b)/(cosh 2a + cos 2b)
    const den = Math.cosh(2 * a) + Math.cos(2 * b);
    const tr = Math.sinh(2 * a) / den, ti = Math.sin(2 * b) / den;
    const nr = zl[0] + z0 * tr, ni = zl[1] + z0 * ti;
    const dr = z0 + zl[0] * tr - zl[1] * ti, di = zl[0] * ti + zl[1] * tr;
    const d = dr * dr + di * di;
    const want: Complex = [(z0 * (nr * dr + ni * di)) / d, (z0 * (ni * dr - nr * di)) / d];
    expectComplex(zinAt([line('lossy', z0, deg, { lossDbPerM: loss })], zl), want);
  });

  it('a matched lossy line of l metres loses lossDbPerM·l dB: |S21| = 10^(−αdB·l/20) (common practice)', () => {
    const d = designOf({
      sweep: { startHz: F, stopHz: F, points: 1 },
      elements: [{ id: 'l', kind: 'line', z0: 50, length: { meters: 0.5, velocityFactor: 0.7 }, lossDbPerM: 3 }],
    });
    const a = analyze(d);
    expect(Math.hypot(a.s.s21[0], a.s.s21[1])).toBeCloseTo(10 ** (-1.5 / 20), 14);
    expect(Math.hypot(a.s.s11[0], a.s.s11[1])).toBeLessThan(1e-15);
    expect(a.powerToLoad[0]).toBeCloseTo(10 ** (-1.5 / 10), 14);
  });
});

describe('chainZin: stubs', () => {
  // The load sits behind the stub; with an open load-side (a huge R) the chain shows the stub alone.
  const OPEN: Complex = [1e13, 0];
  it('an open stub of 30° looks like −jZ0·cot βl (Pozar 4th ed., §2.3 eq. 2.46, from memory)', () => {
    const z = zinAt([{ id: 's', kind: 'open-stub', z0: 50, length: { degrees: 30, atHz: F } }], OPEN);
    expect(z[0]).toBeLessThan(1e-6);
    expect(z[1]).toBeCloseTo(-50 / Math.tan(Math.PI / 6), 5);
  });

  it('a shorted stub of 30° looks like jZ0·tan βl (Pozar 4th ed., §2.3 eq. 2.45, from memory)', () => {
    const z = zinAt([{ id: 's', kind: 'short-stub', z0: 50, length: { degrees: 30, atHz: F } }], OPEN);
    expect(z[1]).toBeCloseTo(50 * Math.tan(Math.PI / 6), 6);
  });

  it('a quarter-wave shorted stub is an open and a quarter-wave open stub a short (Pozar 4th ed., §2.3, from memory)', () => {
    expectComplex(zinAt([{ id: 's', kind: 'short-stub', z0: 70, length: { degrees: 90, atHz: F } }], [33, 12]), [33, 12], 1e-12);
    const z = zinAt([{ id: 'o', kind: 'open-stub', z0: 70, length: { degrees: 90, atHz: F } }], [33, 12]);
    expect(Math.hypot(z[0], z[1])).toBeLessThan(1e-12);
  });

  it('a zero-length shorted stub is a short and a zero-length open stub is absent (engine convention, README)', () => {
    const z = zinAt([{ id: 's', kind: 'short-stub', z0: 50, length: { degrees: 0, atHz: F } }], [33, 12]);
    expect(Math.hypot(z[0], z[1])).toBe(0);
    expectComplex(zinAt([{ id: 'o', kind: 'open-stub', z0: 50, length: { meters: 0, velocityFactor: 1 } }], [33, 12]), [33, 12], 1e-15);
  });

  it('a lossy shorted stub equals a shunt Z0·tanh γl (Pozar 4th ed., §2.7, from memory)', () => {
    const lossDbPerM = 20;
    const el: Element = { id: 's', kind: 'short-stub', z0: 40, length: { meters: 0.05, velocityFactor: 0.8 }, lossDbPerM };
    const a = ((lossDbPerM * Math.LN10) / 20) * 0.05;
    const b = (2 * Math.PI * F * 0.05) / (0.8 * 299_792_458);
    const den = Math.cosh(2 * a) + Math.cos(2 * b);
    const zs: Complex = [(40 * Math.sinh(2 * a)) / den, (40 * Math.sin(2 * b)) / den];
    // Parallel with the load 60 Ω.
    const nr = zs[0] * 60, ni = zs[1] * 60;
    const dr = zs[0] + 60, di = zs[1];
    const d = dr * dr + di * di;
    expectComplex(zinAt([el], [60, 0]), [(nr * dr + ni * di) / d, (ni * dr - nr * di) / d]);
  });
});

describe('chainZin: lumped parts, transformer', () => {
  it('a series L with Q adds R = ωL/Q in series (CONTRACT §2; common practice)', () => {
    expectComplex(zinAt([{ id: 'l', kind: 'series-l', value: 10e-9, q: 40 }], [50, 0]), [50 + (W * 10e-9) / 40, W * 10e-9]);
  });

  it('a shunt C with Q adds G = ωC/Q in parallel (CONTRACT §2; common practice)', () => {
    const c = 2e-12;
    const yr = 1 / 50 + (W * c) / 25, yi = W * c;
    const d = yr * yr + yi * yi;
    expectComplex(zinAt([{ id: 'c', kind: 'shunt-c', value: c, q: 25 }], [50, 0]), [yr / d, -yi / d]);
  });

  it('a series C with Q is 1/(ωC/Q + jωC) in series (CONTRACT §2)', () => {
    const c = 3e-12, q = 60;
    const g = (W * c) / q, b = W * c, d = g * g + b * b;
    expectComplex(zinAt([{ id: 'c', kind: 'series-c', value: c, q }], [10, 5]), [10 + g / d, 5 - b / d]);
  });

  it('a shunt L resonating a shunt C leaves the load alone (common practice)', () => {
    const l = 8e-9;
    const c = 1 / (W * W * l);
    expectComplex(zinAt([{ id: 'l', kind: 'shunt-l', value: l }, { id: 'c', kind: 'shunt-c', value: c }], [75, 0]), [75, 0], 1e-9);
  });

  it('an ideal transformer of ratio n shows n²·Z of the load side (CONTRACT §2)', () => {
    expectComplex(zinAt([{ id: 't', kind: 'transformer', ratio: 2.5 }], [8, -3]), [50, -18.75]);
  });

  it('series R and shunt R (common practice)', () => {
    expectComplex(zinAt([{ id: 'r', kind: 'series-r', value: 12 }, { id: 'g', kind: 'shunt-r', value: 100 }], [13, 0]), [20, 0]);
  });
});

describe('two-port conversion', () => {
  it('sFromAbcd of a series Z gives S11 = Z/(Z + 2Z0), S21 = 2Z0/(Z + 2Z0) (Pozar 4th ed., Table 4.2, common practice)', () => {
    const z: Complex = [30, 40];
    const s = new Float64Array(8);
    sFromAbcd([1, 0, z[0], z[1], 0, 0, 1, 0], 0, 50, s, 0);
    const dr = z[0] + 100, di = z[1], d = dr * dr + di * di;
    expectComplex([s[0], s[1]], [(z[0] * dr + z[1] * di) / d, (z[1] * dr - z[0] * di) / d]);
    expectComplex([s[4], s[5]], [(100 * dr) / d, (-100 * di) / d]);
    expectComplex([s[2], s[3]], [s[4], s[5]], 1e-15);
  });

  it('abcdFromS(sFromAbcd(T)) returns T, for a reciprocal and a non-reciprocal matrix (Pozar 4th ed., Table 4.2)', () => {
    const mats = [
      [0.3, 0.2, 12, -40, 0.004, 0.01, 1.1, -0.3],
      [1.7, 0.5, 3, 9, 0.02, -0.007, 0.4, 0.9],
    ];
    for (const t of mats) {
      const s = new Float64Array(8);
      const back = new Float64Array(8);
      sFromAbcd(t, 0, 50, s, 0);
      expect(abcdFromS(s, 0, 50, back, 0)).toBe(true);
      for (let k = 0; k < 8; k++) expect(back[k]).toBeCloseTo(t[k], 12);
    }
  });

  it('abcdFromS refuses S21 = 0 (no chain matrix exists)', () => {
    expect(abcdFromS([0.5, 0, 0, 0, 0, 0, 0.5, 0], 0, 50, new Float64Array(8), 0)).toBe(false);
  });
});

describe('gammaFromZin', () => {
  it('is the power-wave Γ: zero for Zin = Zs* with a complex port (CONTRACT §1)', () => {
    const g = gammaFromZin(Float64Array.of(20, -15, 50, 0), [20, 15]);
    expect(Math.hypot(g[0], g[1])).toBeLessThan(1e-16);
    expectComplex([g[2], g[3]], [(30 * 70 + 15 * 15) / (70 * 70 + 15 * 15), (15 * 70 - 30 * 15) / (70 * 70 + 15 * 15)]);
  });

  it('chainZin + gammaFromZin agree with analyze() on a mixed chain (same physics, two loops)', () => {
    const d = designOf({
      load: { kind: 'rlc', topology: 'series', r: 12, l: 1.5e-9, c: 2e-12 },
      port: { impedance: [40, 10] },
      elements: [
        { id: 'a', kind: 'series-l', value: 2.2e-9, q: 30 },
        { id: 'b', kind: 'shunt-c', value: 1e-12 },
        { id: 'c', kind: 'line', z0: 70, length: { degrees: 33, atHz: 2.44e9 }, lossDbPerM: 2 },
        { id: 'd', kind: 'short-stub', z0: 50, length: { degrees: 80, atHz: 2.44e9 } },
        { id: 'e', kind: 'transformer', ratio: 1.3 },
        { id: 'f', kind: 'series-c', value: 4e-12, q: 100 },
        { id: 'g', kind: 'shunt-l', value: 6e-9, q: 50 },
        { id: 'h', kind: 'open-stub', z0: 30, length: { meters: 0.01, velocityFactor: 0.7 } },
      ],
    });
    const a = analyze(d);
    const ctx = sweepContext(d);
    const zin = chainZin(ctx, d.elements);
    const g = gammaFromZin(zin, ctx.zs);
    for (let i = 0; i < zin.length; i++) {
      expect(Math.abs(zin[i] - a.zin[i])).toBeLessThan(1e-11 * Math.max(1, Math.abs(a.zin[i])));
      expect(Math.abs(g[i] - a.gamma[i])).toBeLessThan(1e-12);
    }
  });
});

describe('chainZin on a long uniform grid', () => {
  it('the angle-addition shortcut on uniform grids matches direct evaluation point by point (long, lossy and lossless lines)', () => {
    const elements: Element[] = [
      { id: 'a', kind: 'line', z0: 70, length: { degrees: 2000, atHz: 1e9 } },
      { id: 'b', kind: 'open-stub', z0: 40, length: { meters: 0.9, velocityFactor: 0.66 }, lossDbPerM: 0.5 },
      { id: 'c', kind: 'short-stub', z0: 90, length: { degrees: 777, atHz: 1e9 } },
      { id: 'd', kind: 'line', z0: 35, length: { meters: 1.3, velocityFactor: 0.8 }, lossDbPerM: 1 },
    ];
    const d = designOf({ load: { kind: 'impedance', ohms: [30, 20] }, sweep: { startHz: 0.5e9, stopHz: 3e9, points: 20001 }, elements });
    const ctx = sweepContext(d);
    const fast = chainZin(ctx, elements);
    let worst = 0;
    for (let i = 0; i < ctx.freqs.length; i += 97) {
      const one = chainZin(sweepContext(d, Float64Array.of(ctx.freqs[i])), elements);
      worst = Math.max(worst, Math.hypot(fast[2 * i] - one[0], fast[2 * i + 1] - one[1]) / Math.max(1, Math.hypot(one[0], one[1])));
    }
    expect(worst).toBeLessThan(1e-11);
  });
});
