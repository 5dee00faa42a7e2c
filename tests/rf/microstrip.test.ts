import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  MicrostripError,
  microstripAnalyze,
  microstripPhysicalLength,
  microstripSynthesize,
  type Substrate,
} from '../../shared/rf/microstrip';

const relClose = (actual: number, expected: number, rel: number) => {
  if (!(Math.abs(actual - expected) <= rel * Math.abs(expected))) {
    throw new Error(`${actual} is not within ${rel * 100}% of ${expected}`);
  }
};

describe('microstripAnalyze', () => {
  // scikit-rf 0.15 MLine (model Hammerstad–Jensen, t = 0, diel 'frequencyinvariant', disp 'none'):
  // real(Z0) and real(ep_reff) as printed by it.
  const reference: [number, number, number, number, number][] = [
    // widthM, heightM, εr, Z0, εeff
    [3.0e-3, 1.6e-3, 4.4, 50.61726166873013, 3.3254548131553996],
    [0.16e-3, 1.6e-3, 4.4, 153.9469536353601, 2.9132054713318114],
    [10e-3, 1.0e-3, 2.2, 20.439215534792943, 2.015990046075876],
    [0.5e-3, 0.635e-3, 9.8, 55.141004824903675, 6.457373568550722],
    [1.6e-3, 1.6e-3, 1.0, 126.4238652040079, 1.0],
    [0.1e-3, 1e-3, 12.9, 94.94862210402253, 7.658363610863624],
  ];
  for (const [w, h, er, z0, ee] of reference) {
    it(`gives Z0 = ${z0.toFixed(3)} Ω, εeff = ${ee.toFixed(4)} for w = ${w * 1e3} mm, h = ${h * 1e3} mm, εr = ${er} (scikit-rf 0.15 MLine, Hammerstad–Jensen)`, () => {
      const r = microstripAnalyze(w, { epsilonR: er, heightM: h });
      relClose(r.z0, z0, 1e-9);
      relClose(r.epsilonEff, ee, 1e-12);
    });
  }

  it('applies the strip-thickness correction: 3 mm on 1.6 mm FR-4 with 35 µm copper (Hammerstad & Jensen 1980 thickness equations, hand computation)', () => {
    // Hand computation: u = 1.875, T = 0.021875, Δu1 = 0.0432198, Δur = 0.0282803,
    // Z0 = Z01(u + Δur)/√εeff(u + Δur) = 50.16596 Ω, εeff = εeff(u + Δur)·(Z01(u + Δu1)/Z01(u + Δur))² = 3.300805.
    const r = microstripAnalyze(3e-3, { epsilonR: 4.4, heightM: 1.6e-3, copperM: 35e-6 });
    relClose(r.z0, 50.16596085560405, 1e-9);
    relClose(r.epsilonEff, 3.3008045853483248, 1e-9);
  });

  it('thicker copper lowers Z0 and εeff, and zero thickness is the thin-strip result (common practice)', () => {
    const sub = { epsilonR: 4.4, heightM: 1.6e-3 };
    const thin = microstripAnalyze(3e-3, sub);
    const zero = microstripAnalyze(3e-3, { ...sub, copperM: 0 });
    const t18 = microstripAnalyze(3e-3, { ...sub, copperM: 18e-6 });
    const t35 = microstripAnalyze(3e-3, { ...sub, copperM: 35e-6 });
    const t1nm = microstripAnalyze(3e-3, { ...sub, copperM: 1e-12 });
    expect(zero).toEqual(thin);
    expect(t18.z0).toBeLessThan(thin.z0);
    expect(t35.z0).toBeLessThan(t18.z0);
    expect(t35.epsilonEff).toBeLessThan(t18.epsilonEff);
    relClose(t1nm.z0, thin.z0, 1e-6);
  });

  it('gives εeff = 1 on air and the air impedance there (Hammerstad & Jensen 1980, εr = 1)', () => {
    const r = microstripAnalyze(1e-3, { epsilonR: 1, heightM: 1e-3, copperM: 35e-6 });
    expect(r.epsilonEff).toBeCloseTo(1, 14);
  });

  it('Z0 falls and εeff rises between (εr + 1)/2 and εr as the strip widens (property, seeded; common practice)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 20, noNaN: true }),
        fc.double({ min: 0.02, max: 50, noNaN: true }),
        fc.double({ min: 1.001, max: 2, noNaN: true }),
        fc.constantFrom(0, 17.5e-6, 35e-6),
        (er, u, factor, copperM) => {
          const sub: Substrate = { epsilonR: er, heightM: 1e-3, copperM };
          const a = microstripAnalyze(u * 1e-3, sub);
          const b = microstripAnalyze(u * factor * 1e-3, sub);
          expect(b.z0).toBeLessThan(a.z0);
          expect(a.epsilonEff).toBeGreaterThanOrEqual(1 - 1e-12);
          expect(a.epsilonEff).toBeLessThanOrEqual(er + 1e-12);
          if (copperM === 0 && er > 1.01) {
            expect(b.epsilonEff).toBeGreaterThan(a.epsilonEff);
            expect(a.epsilonEff).toBeGreaterThanOrEqual((er + 1) / 2 - 1e-12);
          }
        },
      ),
      { seed: 1980, numRuns: 500 },
    );
  });
});

describe('microstripSynthesize', () => {
  it('makes 50 Ω on 1.6 mm FR-4 (εr 4.4) about 3.0 mm wide (common practice)', () => {
    const r = microstripSynthesize(50, { epsilonR: 4.4, heightM: 1.6e-3 });
    expect(r.widthM).toBeGreaterThan(2.9e-3);
    expect(r.widthM).toBeLessThan(3.15e-3);
    relClose(microstripAnalyze(r.widthM, { epsilonR: 4.4, heightM: 1.6e-3 }).z0, 50, 1e-10);
  });

  it('matches the 50 Ω design on 1.27 mm, εr 2.2 at 2.5 GHz: W ≈ 3.92 mm, εeff ≈ 1.87, 90° ≈ 21.9 mm (Pozar, Microwave Engineering 4th ed., Example 3.7, values from memory; Pozar uses the simpler closed forms, so within 1 %)', () => {
    const r = microstripSynthesize(50, { epsilonR: 2.2, heightM: 1.27e-3 });
    relClose(r.widthM, 3.92e-3, 0.01);
    relClose(r.epsilonEff, 1.87, 0.01);
    relClose(microstripPhysicalLength(90, 2.5e9, r.epsilonEff), 21.9e-3, 0.01);
  });

  it('inverts the analysis for any impedance, substrate and copper (property, seeded)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 10, max: 150, noNaN: true }),
        fc.double({ min: 1, max: 13, noNaN: true }),
        fc.double({ min: 0.1e-3, max: 3.2e-3, noNaN: true }),
        fc.constantFrom(undefined, 0, 17.5e-6, 35e-6, 70e-6),
        (z0, er, h, copperM) => {
          const sub: Substrate = copperM === undefined ? { epsilonR: er, heightM: h } : { epsilonR: er, heightM: h, copperM };
          const s = microstripSynthesize(z0, sub);
          const a = microstripAnalyze(s.widthM, sub);
          relClose(a.z0, z0, 1e-9);
          relClose(a.epsilonEff, s.epsilonEff, 1e-12);
          // And the other way round: analysis then synthesis gives the width back.
          const back = microstripSynthesize(a.z0, sub);
          relClose(back.widthM, s.widthM, 1e-7);
        },
      ),
      { seed: 3197, numRuns: 400 },
    );
  });

  it('reaches very wide and very narrow strips', () => {
    const sub = { epsilonR: 4.4, heightM: 1.6e-3 };
    for (const z0 of [2, 5, 200, 250]) relClose(microstripAnalyze(microstripSynthesize(z0, sub).widthM, sub).z0, z0, 1e-9);
  });

  it('says which impedances the substrate can reach when it cannot make the one asked for', () => {
    const sub = { epsilonR: 4.4, heightM: 1.6e-3 };
    expect(() => microstripSynthesize(1000, sub)).toThrow(MicrostripError);
    expect(() => microstripSynthesize(1000, sub)).toThrow(/^no microstrip width gives 1000 Ω on this substrate \(reachable: 0\.\d\d Ω to \d+\.\d Ω\)$/);
    expect(() => microstripSynthesize(0.01, sub)).toThrow(/^no microstrip width gives 0.01 Ω/);
  });
});

describe('microstripPhysicalLength', () => {
  it('a quarter wave at 3 GHz in air is c/(4f) = 24.98 mm (λ = c/f, common practice)', () => {
    relClose(microstripPhysicalLength(90, 3e9, 1), 299_792_458 / 3e9 / 4, 1e-15);
  });

  it('scales with 1/√εeff and with degrees', () => {
    const l = microstripPhysicalLength(90, 2.44e9, 3.3);
    relClose(l, 299_792_458 / (2.44e9 * Math.sqrt(3.3)) / 4, 1e-15);
    relClose(microstripPhysicalLength(180, 2.44e9, 3.3), 2 * l, 1e-15);
    expect(microstripPhysicalLength(0, 2.44e9, 3.3)).toBe(0);
  });
});

describe('errors', () => {
  const sub = { epsilonR: 4.4, heightM: 1.6e-3 };
  const cases: [string, () => unknown, string][] = [
    ['a negative width', () => microstripAnalyze(-1e-3, sub), 'the strip width (m) must be a positive finite number, got -0.001'],
    ['a zero width', () => microstripAnalyze(0, sub), 'the strip width (m) must be a positive finite number, got 0'],
    ['a NaN width', () => microstripAnalyze(Number.NaN, sub), 'the strip width (m) must be a positive finite number, got NaN'],
    ['εr below 1', () => microstripAnalyze(1e-3, { epsilonR: 0.5, heightM: 1e-3 }), "the substrate's relative permittivity must be a finite number of at least 1, got 0.5"],
    ['an infinite εr', () => microstripSynthesize(50, { epsilonR: Infinity, heightM: 1e-3 }), "the substrate's relative permittivity must be a finite number of at least 1, got Infinity"],
    ['a zero height', () => microstripAnalyze(1e-3, { epsilonR: 4.4, heightM: 0 }), "the substrate's height (m) must be a positive finite number, got 0"],
    ['negative copper', () => microstripAnalyze(1e-3, { ...sub, copperM: -35e-6 }), 'the copper thickness must be zero or a positive finite number of metres, got -0.000035'],
    ['no substrate', () => microstripAnalyze(1e-3, undefined as unknown as Substrate), 'the substrate needs epsilonR and heightM'],
    ['a negative impedance', () => microstripSynthesize(-50, sub), 'the characteristic impedance (Ω) must be a positive finite number, got -50'],
    ['negative degrees', () => microstripPhysicalLength(-90, 1e9, 2), 'the electrical length must be zero or a positive finite number of degrees, got -90'],
    ['a zero frequency', () => microstripPhysicalLength(90, 0, 2), 'the frequency (Hz) must be a positive finite number, got 0'],
    ['εeff below 1', () => microstripPhysicalLength(90, 1e9, 0.9), 'the effective permittivity must be a finite number of at least 1, got 0.9'],
  ];
  for (const [what, fn, message] of cases) {
    it(`rejects ${what}: "${message}"`, () => {
      let err: unknown;
      try {
        fn();
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(MicrostripError);
      expect((err as MicrostripError).message).toBe(message);
      expect((err as MicrostripError).code).toBe('invalid-microstrip');
    });
  }
});
