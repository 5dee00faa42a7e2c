/**
 * IEC 60063 preferred-number series E6 to E192: the mantissas of one decade, exactly as the
 * standard's tables give them, and the nearest / next preferred value across decades.
 *
 * E6, E12 and E24 keep their historical values (2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 8.2), which differ
 * from the rounded formula 10^(i/n). E48, E96 and E192 follow the formula rounded to three figures,
 * except for E192's 9.20 (the formula gives 9.19).
 */

export type ESeries = 'E6' | 'E12' | 'E24' | 'E48' | 'E96' | 'E192';

/** A value for which no preferred value is defined (zero, negative, non-finite), or an unknown series. */
export class ESeriesError extends Error {
  readonly code = 'invalid-preferred-value';
  constructor(message: string) {
    super(message);
    this.name = 'ESeriesError';
  }
}

const E24 = [
  1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1,
] as const;

const E48 = [
  1.00, 1.05, 1.10, 1.15, 1.21, 1.27, 1.33, 1.40, 1.47, 1.54, 1.62, 1.69, 1.78, 1.87, 1.96, 2.05, 2.15, 2.26,
  2.37, 2.49, 2.61, 2.74, 2.87, 3.01, 3.16, 3.32, 3.48, 3.65, 3.83, 4.02, 4.22, 4.42, 4.64, 4.87, 5.11, 5.36,
  5.62, 5.90, 6.19, 6.49, 6.81, 7.15, 7.50, 7.87, 8.25, 8.66, 9.09, 9.53
] as const;

const E96 = [
  1.00, 1.02, 1.05, 1.07, 1.10, 1.13, 1.15, 1.18, 1.21, 1.24, 1.27, 1.30, 1.33, 1.37, 1.40, 1.43, 1.47, 1.50,
  1.54, 1.58, 1.62, 1.65, 1.69, 1.74, 1.78, 1.82, 1.87, 1.91, 1.96, 2.00, 2.05, 2.10, 2.15, 2.21, 2.26, 2.32,
  2.37, 2.43, 2.49, 2.55, 2.61, 2.67, 2.74, 2.80, 2.87, 2.94, 3.01, 3.09, 3.16, 3.24, 3.32, 3.40, 3.48, 3.57,
  3.65, 3.74, 3.83, 3.92, 4.02, 4.12, 4.22, 4.32, 4.42, 4.53, 4.64, 4.75, 4.87, 4.99, 5.11, 5.23, 5.36, 5.49,
  5.62, 5.76, 5.90, 6.04, 6.19, 6.34, 6.49, 6.65, 6.81, 6.98, 7.15, 7.32, 7.50, 7.68, 7.87, 8.06, 8.25, 8.45,
  8.66, 8.87, 9.09, 9.31, 9.53, 9.76
] as const;

const E192 = [
  1.00, 1.01, 1.02, 1.04, 1.05, 1.06, 1.07, 1.09, 1.10, 1.11, 1.13, 1.14, 1.15, 1.17, 1.18, 1.20, 1.21, 1.23,
  1.24, 1.26, 1.27, 1.29, 1.30, 1.32, 1.33, 1.35, 1.37, 1.38, 1.40, 1.42, 1.43, 1.45, 1.47, 1.49, 1.50, 1.52,
  1.54, 1.56, 1.58, 1.60, 1.62, 1.64, 1.65, 1.67, 1.69, 1.72, 1.74, 1.76, 1.78, 1.80, 1.82, 1.84, 1.87, 1.89,
  1.91, 1.93, 1.96, 1.98, 2.00, 2.03, 2.05, 2.08, 2.10, 2.13, 2.15, 2.18, 2.21, 2.23, 2.26, 2.29, 2.32, 2.34,
  2.37, 2.40, 2.43, 2.46, 2.49, 2.52, 2.55, 2.58, 2.61, 2.64, 2.67, 2.71, 2.74, 2.77, 2.80, 2.84, 2.87, 2.91,
  2.94, 2.98, 3.01, 3.05, 3.09, 3.12, 3.16, 3.20, 3.24, 3.28, 3.32, 3.36, 3.40, 3.44, 3.48, 3.52, 3.57, 3.61,
  3.65, 3.70, 3.74, 3.79, 3.83, 3.88, 3.92, 3.97, 4.02, 4.07, 4.12, 4.17, 4.22, 4.27, 4.32, 4.37, 4.42, 4.48,
  4.53, 4.59, 4.64, 4.70, 4.75, 4.81, 4.87, 4.93, 4.99, 5.05, 5.11, 5.17, 5.23, 5.30, 5.36, 5.42, 5.49, 5.56,
  5.62, 5.69, 5.76, 5.83, 5.90, 5.97, 6.04, 6.12, 6.19, 6.26, 6.34, 6.42, 6.49, 6.57, 6.65, 6.73, 6.81, 6.90,
  6.98, 7.06, 7.15, 7.23, 7.32, 7.41, 7.50, 7.59, 7.68, 7.77, 7.87, 7.96, 8.06, 8.16, 8.25, 8.35, 8.45, 8.56,
  8.66, 8.76, 8.87, 8.98, 9.09, 9.20, 9.31, 9.42, 9.53, 9.65, 9.76, 9.88
] as const;

export const E_SERIES: Record<ESeries, readonly number[]> = Object.freeze({
  E6: Object.freeze([1.0, 1.5, 2.2, 3.3, 4.7, 6.8]),
  E12: Object.freeze([1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2]),
  E24: Object.freeze([...E24]),
  E48: Object.freeze([...E48]),
  E96: Object.freeze([...E96]),
  E192: Object.freeze([...E192]),
});

/** Relative slack within which a value counts as equal to a preferred value (rounding in computed values). */
const SAME = 1e-9;

function table(series: ESeries): readonly number[] {
  const t = (E_SERIES as Record<string, readonly number[] | undefined>)[series];
  if (!t) throw new ESeriesError(`unknown E-series "${String(series)}" (expected E6, E12, E24, E48, E96 or E192)`);
  return t;
}

function checkValue(value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
    throw new ESeriesError(`a preferred value needs a positive finite number, got ${String(value)}`);
  }
}

/** mantissa × 10^decade as the double nearest the decimal value (4.7 × 10^-9 -> 4.7e-9, not 4.700000000000001e-9). */
function valueOf(mantissa: number, decade: number): number {
  return Number(`${mantissa}e${decade}`);
}

/**
 * The preferred values around `value`, ascending: four consecutive entries of the series counted
 * across decades, two at or below `value` and two above (enough to absorb rounding in `value / 10^d`).
 */
function around(value: number, series: ESeries): number[] {
  const t = table(series);
  const n = t.length;
  const decade = Math.floor(Math.log10(value));
  const m = value / 10 ** decade;
  // The last entry not above m (index -1 when m is a hair below 1.0).
  let lo = -1;
  let hi = n;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (t[mid] <= m) lo = mid;
    else hi = mid;
  }
  const k0 = decade * n + lo;
  const out: number[] = [];
  for (let k = k0 - 1; k <= k0 + 2; k++) {
    const d = Math.floor(k / n);
    out.push(valueOf(t[k - d * n], d));
  }
  return out;
}

/** The preferred value nearest `value` on a logarithmic scale (a tie goes to the larger value). */
export function nearestPreferred(value: number, series: ESeries): number {
  checkValue(value);
  const lv = Math.log(value);
  let best = Number.NaN;
  let bestDist = Infinity;
  for (const c of around(value, series)) {
    const dist = Math.abs(Math.log(c) - lv);
    if (dist < bestDist - 1e-12 || (Math.abs(dist - bestDist) <= 1e-12 && c > best)) {
      best = c;
      bestDist = dist;
    }
  }
  return best;
}

/** The smallest preferred value strictly greater than `value` (a value within 1e-9 of a preferred value counts as that value). */
export function nextPreferredUp(value: number, series: ESeries): number {
  checkValue(value);
  const cs = around(value, series);
  for (const c of cs) if (c > value * (1 + SAME)) return c;
  return cs[cs.length - 1];
}

/** The largest preferred value strictly smaller than `value` (a value within 1e-9 of a preferred value counts as that value). */
export function nextPreferredDown(value: number, series: ESeries): number {
  checkValue(value);
  const cs = around(value, series);
  for (let i = cs.length - 1; i >= 0; i--) if (cs[i] < value * (1 - SAME)) return cs[i];
  return cs[0];
}

/** True when `value` lies within `relTol` (relative, default 1e-6) of a preferred value of `series`. */
export function isPreferred(value: number, series: ESeries, relTol = 1e-6): boolean {
  if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) return false;
  if (!(relTol >= 0)) throw new ESeriesError(`relTol must be zero or positive, got ${String(relTol)}`);
  const p = nearestPreferred(value, series);
  return Math.abs(p - value) <= relTol * p;
}

/** Alias of `ESeries` (the name some callers use). */
export type ESeriesName = ESeries;
