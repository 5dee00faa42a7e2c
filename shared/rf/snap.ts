/**
 * E-series snapping of a chain's lumped L and C values (common practice: parts come in preferred
 * values). Lines, stubs, resistors, transformers and two-ports are left as they are.
 */
import type { Element } from './design';
import { E_SERIES, nearestPreferred, type ESeries } from './eseries';

/** True for the elements whose value snapping applies to (inductors and capacitors). */
export function isSnappable(e: Pick<Element, 'kind'>): boolean {
  return e.kind === 'series-l' || e.kind === 'series-c' || e.kind === 'shunt-l' || e.kind === 'shunt-c';
}

/**
 * The same value as eseries.ts `nearestPreferred` (nearest on a log scale, a tie to the larger), found
 * with one table scan and one decimal conversion, since the finder snaps hundreds of values per call.
 */
export function preferredNearest(value: number, series: ESeries): number {
  const t = E_SERIES[series];
  if (!t || !(value > 0) || !Number.isFinite(value)) return nearestPreferred(value, series);
  let decade = Math.floor(Math.log10(value));
  let m = value / Math.pow(10, decade);
  if (m >= 10) {
    m /= 10;
    decade += 1;
  } else if (m < 1) {
    m *= 10;
    decade -= 1;
  }
  const lm = Math.log(m);
  let best = t[0];
  let bestDecade = decade;
  let bestDist = Infinity;
  const consider = (c: number, d: number, dist: number) => {
    if (dist < bestDist - 1e-12 || (Math.abs(dist - bestDist) <= 1e-12 && c * Math.pow(10, d) > best * Math.pow(10, bestDecade))) {
      best = c;
      bestDecade = d;
      bestDist = dist;
    }
  };
  consider(t[t.length - 1], decade - 1, Math.abs(Math.log(t[t.length - 1] / 10) - lm));
  for (const c of t) consider(c, decade, Math.abs(Math.log(c) - lm));
  consider(1, decade + 1, Math.abs(Math.log(10) - lm));
  return Number(`${best}e${bestDecade}`);
}

/** The element with its value moved to the nearest preferred value of `series` (unchanged when not snappable). */
export function elementSnapped<E extends Element>(e: E, series: ESeries): E {
  if (!isSnappable(e) || !('value' in e)) return e;
  return { ...e, value: preferredNearest(e.value, series) };
}

/** Every snappable element of the chain snapped; `skip(i)` leaves element i alone (e.g. kept or locked ones). */
export function chainSnapped(elements: readonly Element[], series: ESeries, skip: (i: number) => boolean = () => false): Element[] {
  return elements.map((e, i) => (skip(i) ? e : elementSnapped(e, series)));
}

/** Whether the chain has anything to snap. */
export function chainHasSnappable(elements: readonly Element[]): boolean {
  return elements.some(isSnappable);
}
