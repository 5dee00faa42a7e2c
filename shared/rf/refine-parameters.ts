/**
 * What refine may tune, and how: each unlocked L or C value as ln(value), each line or stub length as
 * its electrical length in degrees at the band centre, each transformer ratio as ln(ratio). Resistors
 * and measured two-ports are never tuned (a resistor "matches" by turning power into heat).
 *
 * Bounds keep values physical: a lumped part's reactance (or susceptance, for a shunt part) at the
 * centre stays within 10^±3 of Z0 (of 1/Z0); lengths stay within [0°, 180°] (beyond half a wave a line
 * repeats itself at the centre, only narrower), ratios within [1/100, 100]; a bound always widens to
 * include the element's starting value.
 */
import type { Element } from './design';
import { SPEED_OF_LIGHT } from './elements';

export type ParameterKind = 'log-value' | 'degrees' | 'log-ratio';

export interface RefineParameter {
  readonly elementIndex: number;
  readonly kind: ParameterKind;
  readonly lower: number;
  readonly upper: number;
  readonly step: number;
  readonly start: number;
}

const SPAN = 1e3;

function lumpedRange(e: Extract<Element, { value: number }>, omega: number, z0: number): [number, number] | null {
  switch (e.kind) {
    case 'series-l':
    case 'shunt-l':
      return [z0 / SPAN / omega, (z0 * SPAN) / omega];
    case 'series-c':
    case 'shunt-c':
      return [1 / (omega * z0 * SPAN), SPAN / (omega * z0)];
    default:
      return null;
  }
}

/** Electrical length in degrees at `hz` of a line's length. */
export function lengthDegreesAt(length: Extract<Element, { kind: 'line' }>['length'], hz: number): number {
  if ('degrees' in length) return (length.degrees * hz) / length.atHz;
  return (360 * length.meters * hz) / (length.velocityFactor * SPEED_OF_LIGHT);
}

/** The tunable parameters of a chain, for centre frequency `centerHz` and reference `z0`. */
export function refineParameters(elements: readonly Element[], centerHz: number, z0: number, isFree: (i: number) => boolean = (i) => !elements[i].locked): RefineParameter[] {
  const omega = 2 * Math.PI * centerHz;
  const out: RefineParameter[] = [];
  elements.forEach((e, i) => {
    if (!isFree(i)) return;
    if ('value' in e) {
      const range = lumpedRange(e, omega, z0);
      if (!range) return;
      const start = Math.log(e.value);
      out.push({ elementIndex: i, kind: 'log-value', lower: Math.min(Math.log(range[0]), start), upper: Math.max(Math.log(range[1]), start), step: 0.4, start });
    } else if (e.kind === 'line' || e.kind === 'open-stub' || e.kind === 'short-stub') {
      const start = lengthDegreesAt(e.length, centerHz);
      out.push({ elementIndex: i, kind: 'degrees', lower: 0, upper: Math.max(180, start), step: 20, start });
    } else if (e.kind === 'transformer') {
      const start = Math.log(e.ratio);
      out.push({ elementIndex: i, kind: 'log-ratio', lower: Math.min(Math.log(0.01), start), upper: Math.max(Math.log(100), start), step: 0.3, start });
    }
  });
  return out;
}

/** The chain with parameter values `x` written into its elements (other elements shared, not copied). */
export function elementsWithParameters(elements: readonly Element[], params: readonly RefineParameter[], x: ArrayLike<number>, centerHz: number): Element[] {
  const out = elements.slice();
  params.forEach((p, k) => {
    const e = out[p.elementIndex];
    const v = x[k];
    if (p.kind === 'log-value' && 'value' in e) out[p.elementIndex] = { ...e, value: Math.exp(v) };
    else if (p.kind === 'log-ratio' && e.kind === 'transformer') out[p.elementIndex] = { ...e, ratio: Math.exp(v) };
    else if (p.kind === 'degrees' && (e.kind === 'line' || e.kind === 'open-stub' || e.kind === 'short-stub')) {
      const length =
        'degrees' in e.length
          ? { degrees: (v * e.length.atHz) / centerHz, atHz: e.length.atHz }
          : { meters: (v / 360) * ((e.length.velocityFactor * SPEED_OF_LIGHT) / centerHz), velocityFactor: e.length.velocityFactor };
      out[p.elementIndex] = { ...e, length };
    }
  });
  return out;
}
