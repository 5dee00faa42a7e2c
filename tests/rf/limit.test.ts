import { describe, expect, it } from 'vitest';
import { analyze } from '../../shared/rf/analyze';
import { goalMaxGamma, type Design } from '../../shared/rf/design';
import { bodeFanoLimit, bodeFanoMaxFractional, loadQFit } from '../../shared/rf/limit';
import { designOf, logUniform, seededRandom } from './helpers';
import { randomChain } from './random-chains';

const F0 = 2.44e9;
const W0 = 2 * Math.PI * F0;
const GM = 1 / 3; // VSWR 2

const limitOf = (load: Design['load'], fractional: number | null = null) =>
  bodeFanoLimit(designOf({ load }), F0, GM, fractional);

describe('Bode–Fano limit for the four load types (Fano 1950; Pozar, Microwave Engineering 4th ed., §5.9, from memory)', () => {
  it('parallel RC: ∫ln(1/|Γ|)dω ≤ π/(RC) gives Δω/ω0 ≤ π/(ω0·R·C·ln(1/Γm))', () => {
    const r = 200, c = 1e-12;
    const lim = limitOf({ kind: 'rlc', topology: 'parallel', r, c })!;
    expect(lim.model).toBe('parallel-rc');
    expect(lim.maxFractional * W0).toBeCloseTo(Math.PI / (r * c * Math.log(1 / GM)), 0);
    expect(lim.maxFractional).toBeCloseTo(Math.PI / (W0 * r * c * Math.log(3)), 12);
  });

  it('series RC: ∫ω⁻²ln(1/|Γ|)dω ≤ πRC gives Δω/ω0 ≤ π·ω0·R·C/ln(1/Γm) (ω1ω2 ≈ ω0²)', () => {
    const r = 12, c = 2e-12;
    const lim = limitOf({ kind: 'rlc', topology: 'series', r, c })!;
    expect(lim.model).toBe('series-rc');
    expect(lim.maxFractional).toBeCloseTo((Math.PI * W0 * r * c) / Math.log(3), 12);
  });

  it('parallel RL: ∫ω⁻²ln(1/|Γ|)dω ≤ πL/R gives Δω/ω0 ≤ π·ω0·L/(R·ln(1/Γm))', () => {
    const r = 300, l = 5e-9;
    const lim = limitOf({ kind: 'rlc', topology: 'parallel', r, l })!;
    expect(lim.model).toBe('parallel-rl');
    expect(lim.maxFractional).toBeCloseTo((Math.PI * W0 * l) / (r * Math.log(3)), 12);
  });

  it('series RL: ∫ln(1/|Γ|)dω ≤ πR/L gives Δω/ω0 ≤ π·R/(ω0·L·ln(1/Γm))', () => {
    const r = 10, l = 8e-9;
    const lim = limitOf({ kind: 'rlc', topology: 'series', r, l })!;
    expect(lim.model).toBe('series-rl');
    expect(lim.maxFractional).toBeCloseTo((Math.PI * r) / (W0 * l * Math.log(3)), 12);
  });

  it('the bound is π/(Q·ln(1/Γm)); VSWR 2 (Γm = 1/3) with Q = 10 allows 28.6 % (from memory: Pozar §5.9 discussion)', () => {
    expect(bodeFanoMaxFractional(10, GM)).toBeCloseTo(0.28596, 5);
  });

  it('a series R with both L and C obeys both series integrals: the tighter one is reported (engine fit, README)', () => {
    const lim = limitOf({ kind: 'rlc', topology: 'series', r: 12, l: 1.5e-9, c: 2e-12 })!;
    // ω0L = 23 Ω < 1/(ω0C) = 32.6 Ω: the RC integral is tighter.
    expect(lim.model).toBe('series-rc');
    expect(lim.maxFractional).toBeCloseTo((Math.PI * W0 * 12 * 2e-12) / Math.log(3), 12);
  });

  it('ratio = bandwidth.fractional / maxFractional, and 0 where the goal fails at the centre (engine convention)', () => {
    const lim = limitOf({ kind: 'rlc', topology: 'parallel', r: 200, c: 1e-12 }, 0.05)!;
    expect(lim.ratio).toBeCloseTo(0.05 / lim.maxFractional, 14);
    expect(limitOf({ kind: 'rlc', topology: 'parallel', r: 200, c: 1e-12 }, null)!.ratio).toBe(0);
  });

  it('no limit for a load with no reactance, a lossless series load, or R = 0 (engine convention)', () => {
    expect(limitOf({ kind: 'impedance', ohms: [30, 0] })).toBeNull();
    expect(limitOf({ kind: 'rlc', topology: 'series', r: 30 })).toBeNull();
    expect(limitOf({ kind: 'rlc', topology: 'series', r: 0, l: 1e-9 })).toBeNull();
    expect(limitOf({ kind: 'impedance', ohms: [0, 40] })).toBeNull();
  });

  it('a constant impedance is fitted at the centre as a series model with Q = |X|/R (engine fit, README)', () => {
    expect(loadQFit(designOf({ load: { kind: 'impedance', ohms: [20, -60] } }), F0)).toEqual({ model: 'series-rc', q: 3 });
    expect(loadQFit(designOf({ load: { kind: 'impedance', ohms: [20, 50] } }), F0)).toEqual({ model: 'series-rl', q: 2.5 });
  });

  it('a table load sampled from a parallel RC is recognised as parallel-rc by its dispersion (engine fit, README)', () => {
    const r = 150, c = 1.3e-12;
    const points: [number, number, number][] = [];
    for (let f = 2e9; f <= 3e9; f += 0.01e9) {
      const g = 1 / r, b = 2 * Math.PI * f * c, d = g * g + b * b;
      points.push([f, g / d, -b / d]);
    }
    const fit = loadQFit(designOf({ load: { kind: 'table', points } }), F0)!;
    expect(fit.model).toBe('parallel-rc');
    expect(fit.q).toBeCloseTo(W0 * r * c, 3);
  });
});

describe('no lossless chain beats the bound (Fano 1950: the integral holds for every lossless network)', () => {
  // For a parallel-RC or series-RL load the integral is in dω, so any contiguous stretch with |Γ| ≤ Γm
  // obeys Δω·ln(1/Γm) ≤ the integral ≤ the bound: ratio ≤ 1 rigorously.
  it('60 seeded random lossless chains on a parallel RC load all have ratio ≤ 1', () => {
    const rnd = seededRandom(42);
    let bestRatio = 0;
    for (let k = 0; k < 60; k++) {
      const d = designOf({
        load: { kind: 'rlc', topology: 'parallel', r: 100 + rnd() * 200, c: logUniform(rnd, 0.2e-12, 2e-12) },
        sweep: { startHz: 0.5e9, stopHz: 6e9, points: 2001 },
        goal: { maxVswr: 1.5 + rnd() * 2 },
        elements: randomChain(rnd, { lossy: false, kinds: ['series-l', 'series-c', 'shunt-l', 'shunt-c', 'line', 'open-stub', 'short-stub', 'transformer'] }),
      });
      const a = analyze(d);
      expect(a.limit).not.toBeNull();
      expect(a.maxGamma).toBeCloseTo(goalMaxGamma(d.goal), 15);
      expect(a.limit!.ratio).toBeLessThanOrEqual(1);
      bestRatio = Math.max(bestRatio, a.limit!.ratio);
    }
    expect(bestRatio).toBeLessThanOrEqual(1);
  });

  it('a resonated parallel RC behind a quarter-wave transformer gets a sizeable share of the bound, still ≤ 1', () => {
    const r = 200, c = 1e-12;
    const d = designOf({
      load: { kind: 'rlc', topology: 'parallel', r, c },
      sweep: { startHz: 1.5e9, stopHz: 3.5e9, points: 4001 },
      elements: [
        { id: 'l', kind: 'shunt-l', value: 1 / (W0 * W0 * c) },
        { id: 'q', kind: 'line', z0: Math.sqrt(50 * r), length: { degrees: 90, atHz: F0 } },
      ],
    });
    const a = analyze(d);
    expect(a.centerGamma).toBeLessThan(1e-9);
    expect(a.limit!.ratio).toBeGreaterThan(0.1);
    expect(a.limit!.ratio).toBeLessThan(1);
  });
});
