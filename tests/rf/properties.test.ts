// Seeded property tests of the cascade (fast-check): energy conservation, reciprocity, identities.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyze } from '../../shared/rf/analyze';
import { chainZin, sweepContext } from '../../shared/rf/cascade';
import { type Element } from '../../shared/rf/design';
import { designOf, seededRandom } from './helpers';
import { randomChain, randomLoad } from './random-chains';

const RUNS = { seed: 20261201, numRuns: 150 };
const LOSSLESS: Element['kind'][] = ['series-l', 'series-c', 'shunt-l', 'shunt-c', 'line', 'open-stub', 'short-stub', 'transformer'];

const designFrom = (seed: number, lossy: boolean) => {
  const rnd = seededRandom(seed);
  return designOf({
    load: randomLoad(rnd),
    sweep: { startHz: 0.3e9, stopHz: 5e9, points: 41, spacing: rnd() < 0.5 ? 'log' : 'linear' },
    elements: randomChain(rnd, lossy ? {} : { lossy: false, kinds: LOSSLESS }),
  });
};

const abs2 = (a: Float64Array, i: number) => a[2 * i] ** 2 + a[2 * i + 1] ** 2;

/** Largest |a − b| / max(1, |b|) over the complex points of two interleaved series. */
function relError(a: Float64Array, b: Float64Array): number {
  let worst = 0;
  for (let i = 0; i < a.length; i += 2) {
    const d = Math.hypot(a[i] - b[i], a[i + 1] - b[i + 1]) / Math.max(1, Math.hypot(b[i], b[i + 1]));
    if (!(d <= worst)) worst = d;
  }
  return worst;
}

describe('cascade properties (fast-check, seeded)', () => {
  it('a lossless chain conserves power: |S11|² + |S21|² = 1 and |S12|² + |S22|² = 1 (Pozar 4th ed., §4.3 unitary S, from memory)', () => {
    fc.assert(
      fc.property(fc.integer(), (seed) => {
        const { s } = analyze(designFrom(seed, false));
        let worst = 0;
        for (let i = 0; i < s.s11.length / 2; i++)
          worst = Math.max(worst, Math.abs(abs2(s.s11, i) + abs2(s.s21, i) - 1), Math.abs(abs2(s.s12, i) + abs2(s.s22, i) - 1));
        expect(worst).toBeLessThan(1e-9);
      }),
      RUNS,
    );
  });

  it('every chain of passive parts is reciprocal: S12 = S21 (Pozar 4th ed., §4.3, from memory)', () => {
    fc.assert(
      fc.property(fc.integer(), (seed) => {
        const { s } = analyze(designFrom(seed, true));
        let worst = 0;
        for (let i = 0; i < s.s12.length; i++) worst = Math.max(worst, Math.abs(s.s12[i] - s.s21[i]) / Math.max(1, Math.abs(s.s21[i])));
        expect(worst).toBeLessThan(1e-9);
      }),
      RUNS,
    );
  });

  it('a zero-length line inserted anywhere is transparent (common practice)', () => {
    fc.assert(
      fc.property(fc.integer(), fc.nat(), fc.double({ min: 5, max: 200, noNaN: true }), (seed, at, z0) => {
        const d = designFrom(seed, true);
        const k = at % (d.elements.length + 1);
        const zero: Element = { id: 'zero', kind: 'line', z0, length: { meters: 0, velocityFactor: 0.7 } };
        const ctx = sweepContext(d);
        const a = chainZin(ctx, d.elements);
        const b = chainZin(ctx, [...d.elements.slice(0, k), zero, ...d.elements.slice(k)]);
        expect(relError(a, b)).toBeLessThanOrEqual(1e-12);
      }),
      RUNS,
    );
  });

  it('identity elements (ratio-1 transformer, zero-length line and open stub) leave analyze() unchanged, and an empty chain shows the load', () => {
    fc.assert(
      fc.property(fc.integer(), (seed) => {
        const d = designFrom(seed, true);
        const ids: Element[] = [
          { id: 'i1', kind: 'transformer', ratio: 1 },
          { id: 'i2', kind: 'line', z0: 50, length: { degrees: 0, atHz: 1e9 } },
          { id: 'i3', kind: 'open-stub', z0: 50, length: { degrees: 0, atHz: 1e9 } },
        ];
        const a = analyze(d);
        const b = analyze({ ...d, elements: [...ids, ...d.elements, ...ids.map((e) => ({ ...e, id: `${e.id}b` }))] });
        expect(relError(a.gamma, b.gamma)).toBeLessThan(1e-12);
        expect(relError(a.s.s21, b.s.s21)).toBeLessThan(1e-12);
        const empty = analyze({ ...d, elements: [] });
        expect(relError(empty.zin, sweepContext(d).loadZ)).toBeLessThan(1e-12);
      }),
      RUNS,
    );
  });

  it('the fast path and analyze() agree on every random chain (two implementations of the same physics)', () => {
    fc.assert(
      fc.property(fc.integer(), (seed) => {
        const d = designFrom(seed, true);
        const z = chainZin(sweepContext(d), d.elements);
        const a = analyze(d);
        expect(relError(z, a.zin)).toBeLessThanOrEqual(1e-10);
      }),
      RUNS,
    );
  });
});
