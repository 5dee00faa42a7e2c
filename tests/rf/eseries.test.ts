import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  E_SERIES,
  ESeriesError,
  isPreferred,
  nearestPreferred,
  nextPreferredDown,
  nextPreferredUp,
  type ESeries,
} from '../../shared/rf/eseries';

const ALL: ESeries[] = ['E6', 'E12', 'E24', 'E48', 'E96', 'E192'];

describe('E_SERIES tables', () => {
  it('E6 is 1.0 1.5 2.2 3.3 4.7 6.8 (IEC 60063, from memory)', () => {
    expect(E_SERIES.E6).toEqual([1.0, 1.5, 2.2, 3.3, 4.7, 6.8]);
  });

  it('E12 is 1.0 1.2 1.5 1.8 2.2 2.7 3.3 3.9 4.7 5.6 6.8 8.2 (IEC 60063, from memory)', () => {
    expect(E_SERIES.E12).toEqual([1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2]);
  });

  it('E24 is the published table (IEC 60063, from memory)', () => {
    expect(E_SERIES.E24).toEqual([
      1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1,
    ]);
  });

  it('E24 and below keep the historical values, not the rounded formula 10^(i/n) (IEC 60063, from memory)', () => {
    const formula = (n: number) => Array.from({ length: n }, (_, i) => Number((10 ** (i / n)).toFixed(1)));
    const differ = (s: ESeries, n: number) => E_SERIES[s].filter((v, i) => v !== formula(n)[i]);
    expect(differ('E6', 6)).toEqual([3.3, 4.7]);
    expect(differ('E12', 12)).toEqual([2.7, 3.3, 3.9, 4.7, 8.2]);
    expect(differ('E24', 24)).toEqual([2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 8.2]);
  });

  it('E48 is the published table (IEC 60063, from memory)', () => {
    expect(E_SERIES.E48).toEqual([
      1.0, 1.05, 1.1, 1.15, 1.21, 1.27, 1.33, 1.4, 1.47, 1.54, 1.62, 1.69, 1.78, 1.87, 1.96, 2.05, 2.15, 2.26, 2.37, 2.49, 2.61,
      2.74, 2.87, 3.01, 3.16, 3.32, 3.48, 3.65, 3.83, 4.02, 4.22, 4.42, 4.64, 4.87, 5.11, 5.36, 5.62, 5.9, 6.19, 6.49, 6.81, 7.15,
      7.5, 7.87, 8.25, 8.66, 9.09, 9.53,
    ]);
  });

  it('E96 is the published table (IEC 60063, from memory)', () => {
    expect(E_SERIES.E96).toEqual([
      1.0, 1.02, 1.05, 1.07, 1.1, 1.13, 1.15, 1.18, 1.21, 1.24, 1.27, 1.3, 1.33, 1.37, 1.4, 1.43, 1.47, 1.5, 1.54, 1.58, 1.62,
      1.65, 1.69, 1.74, 1.78, 1.82, 1.87, 1.91, 1.96, 2.0, 2.05, 2.1, 2.15, 2.21, 2.26, 2.32, 2.37, 2.43, 2.49, 2.55, 2.61, 2.67,
      2.74, 2.8, 2.87, 2.94, 3.01, 3.09, 3.16, 3.24, 3.32, 3.4, 3.48, 3.57, 3.65, 3.74, 3.83, 3.92, 4.02, 4.12, 4.22, 4.32, 4.42,
      4.53, 4.64, 4.75, 4.87, 4.99, 5.11, 5.23, 5.36, 5.49, 5.62, 5.76, 5.9, 6.04, 6.19, 6.34, 6.49, 6.65, 6.81, 6.98, 7.15, 7.32,
      7.5, 7.68, 7.87, 8.06, 8.25, 8.45, 8.66, 8.87, 9.09, 9.31, 9.53, 9.76,
    ]);
  });

  it('E192 is the three-figure formula except 9.20 where the formula gives 9.19 (IEC 60063, from memory)', () => {
    const e192 = E_SERIES.E192;
    expect(e192.length).toBe(192);
    const formula = Array.from({ length: 192 }, (_, i) => Number((10 ** (i / 192)).toPrecision(3)));
    const exceptions = e192.map((v, i) => [i, v, formula[i]]).filter(([, v, f]) => v !== f);
    expect(exceptions).toEqual([[185, 9.2, 9.19]]);
    // A few published E192 values (IEC 60063, from memory).
    expect(e192.slice(0, 8)).toEqual([1.0, 1.01, 1.02, 1.04, 1.05, 1.06, 1.07, 1.09]);
    expect(e192.slice(-8)).toEqual([9.09, 9.2, 9.31, 9.42, 9.53, 9.65, 9.76, 9.88]);
  });

  it('each series is every second value of the next finer one from E48 up (IEC 60063, from memory)', () => {
    expect(E_SERIES.E192.filter((_, i) => i % 2 === 0)).toEqual(E_SERIES.E96);
    expect(E_SERIES.E96.filter((_, i) => i % 2 === 0)).toEqual(E_SERIES.E48);
    expect(E_SERIES.E24.filter((_, i) => i % 2 === 0)).toEqual(E_SERIES.E12);
    expect(E_SERIES.E12.filter((_, i) => i % 2 === 0)).toEqual(E_SERIES.E6);
  });

  it('every table ascends strictly within [1, 10) and cannot be changed', () => {
    for (const s of ALL) {
      const t = E_SERIES[s];
      expect(t[0]).toBe(1);
      expect(t[t.length - 1]).toBeLessThan(10);
      for (let i = 1; i < t.length; i++) expect(t[i]).toBeGreaterThan(t[i - 1]);
      expect(Object.isFrozen(t)).toBe(true);
    }
  });
});

describe('nearestPreferred', () => {
  const cases: [number, ESeries, number][] = [
    [9.9, 'E12', 10],
    [9.0, 'E12', 8.2], // ln(9/8.2) = 0.093 < ln(10/9) = 0.105
    [Math.sqrt(82), 'E12', 10], // the geometric midpoint of 8.2 and 10: a tie goes up
    [1.05, 'E12', 1.0],
    [4.6e-9, 'E24', 4.7e-9],
    [3.1e-12, 'E24', 3.0e-12],
    [50, 'E96', 49.9],
    [0.95, 'E6', 1.0],
    [0.99e-3, 'E24', 1e-3],
    [1.234e6, 'E192', 1.23e6],
    [1.236e6, 'E192', 1.24e6],
    [9.2, 'E192', 9.2],
    [150, 'E6', 150],
    [1e-15, 'E12', 1e-15],
    [1e15, 'E12', 1e15],
  ];
  for (const [value, series, expected] of cases) {
    it(`nearestPreferred(${value}, ${series}) is ${expected} (log distance across decades, common practice)`, () => {
      expect(nearestPreferred(value, series)).toBe(expected);
    });
  }

  it('returns clean decimal values (4.7e-9, not 4.700000000000001e-9)', () => {
    expect(nearestPreferred(4.69e-9, 'E12')).toBe(4.7e-9);
    expect(String(nearestPreferred(3.31e-12, 'E24'))).toBe('3.3e-12');
    expect(String(nearestPreferred(0.0682, 'E12'))).toBe('0.068');
  });
});

describe('nextPreferredUp and nextPreferredDown', () => {
  const up: [number, ESeries, number][] = [
    [9.9, 'E12', 10],
    [8.2, 'E12', 10],
    [1.0, 'E12', 1.2],
    [4.7e-9, 'E12', 5.6e-9],
    [4.7 * 1e-9, 'E12', 5.6e-9], // 4.700000000000001e-9 counts as 4.7e-9
    [4.71e-9, 'E12', 5.6e-9],
    [0.0999, 'E24', 0.1],
    [9.88, 'E192', 10],
    [1e-3, 'E6', 1.5e-3],
  ];
  for (const [value, series, expected] of up) {
    it(`nextPreferredUp(${value}, ${series}) is ${expected} (strictly greater, common practice)`, () => {
      expect(nextPreferredUp(value, series)).toBe(expected);
    });
  }
  const down: [number, ESeries, number][] = [
    [1.0, 'E12', 0.82],
    [1e-9, 'E24', 0.91e-9],
    [10, 'E12', 8.2],
    [5.6e-9, 'E12', 4.7e-9],
    [5.5e-9, 'E12', 4.7e-9],
    [1.01, 'E12', 1.0],
    [100, 'E96', 97.6],
    [1, 'E192', 0.988],
    [1e-3, 'E6', 0.68e-3],
  ];
  for (const [value, series, expected] of down) {
    it(`nextPreferredDown(${value}, ${series}) is ${expected} (strictly smaller, common practice)`, () => {
      expect(nextPreferredDown(value, series)).toBe(expected);
    });
  }

  it('brackets every value, and up and down undo each other on preferred values (property, seeded)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-14, max: 1e12, noNaN: true }), fc.constantFrom(...ALL), (value, series) => {
        const u = nextPreferredUp(value, series);
        const d = nextPreferredDown(value, series);
        expect(u).toBeGreaterThan(value);
        expect(d).toBeLessThan(value);
        expect(isPreferred(u, series, 0)).toBe(true);
        expect(isPreferred(d, series, 0)).toBe(true);
        expect(nextPreferredDown(u, series)).toBeLessThan(value * (1 + 1e-9));
        expect(nextPreferredUp(d, series)).toBeGreaterThan(value * (1 - 1e-9));
        const n = nearestPreferred(value, series);
        expect([u, d, n].includes(nearestPreferred(n, series))).toBe(true);
        // The nearest value is no farther (on a log scale) than either neighbour.
        const dist = (x: number) => Math.abs(Math.log(x / value));
        expect(dist(n)).toBeLessThanOrEqual(Math.min(dist(u), dist(d)) + 1e-12);
        expect(nextPreferredDown(nextPreferredUp(n, series), series)).toBe(n);
      }),
      { seed: 60063, numRuns: 1000 },
    );
  });
});

describe('isPreferred', () => {
  it('recognises preferred values in any decade (IEC 60063, from memory)', () => {
    expect(isPreferred(4.7e-9, 'E12')).toBe(true);
    expect(isPreferred(4.7 * 1e-9, 'E12')).toBe(true);
    expect(isPreferred(4.7e-9, 'E6')).toBe(true);
    expect(isPreferred(5.6e-9, 'E6')).toBe(false);
    expect(isPreferred(4.75e3, 'E96')).toBe(true);
    expect(isPreferred(4.75e3, 'E48')).toBe(false);
    expect(isPreferred(9.19, 'E192')).toBe(false);
    expect(isPreferred(4.6e-9, 'E24')).toBe(false);
  });

  it('uses the relative tolerance it is given', () => {
    expect(isPreferred(4.71, 'E12')).toBe(false);
    expect(isPreferred(4.71, 'E12', 0.01)).toBe(true);
    expect(isPreferred(4.7, 'E12', 0)).toBe(true);
  });

  it('is false for values with no preferred value', () => {
    expect(isPreferred(0, 'E12')).toBe(false);
    expect(isPreferred(-4.7, 'E12')).toBe(false);
    expect(isPreferred(Number.NaN, 'E12')).toBe(false);
  });
});

describe('errors', () => {
  for (const bad of [0, -1, Number.NaN, Number.POSITIVE_INFINITY]) {
    it(`rejects ${bad} with a clear ESeriesError`, () => {
      for (const fn of [nearestPreferred, nextPreferredUp, nextPreferredDown]) {
        expect(() => fn(bad, 'E12')).toThrow(ESeriesError);
        expect(() => fn(bad, 'E12')).toThrow(`a preferred value needs a positive finite number, got ${bad}`);
      }
    });
  }

  it('rejects an unknown series and a negative tolerance', () => {
    expect(() => nearestPreferred(1, 'E5' as ESeries)).toThrow('unknown E-series "E5" (expected E6, E12, E24, E48, E96 or E192)');
    expect(() => isPreferred(1, 'E12', -1)).toThrow(ESeriesError);
    try {
      nearestPreferred(-1, 'E12');
    } catch (err) {
      expect((err as ESeriesError).code).toBe('invalid-preferred-value');
    }
  });
});
