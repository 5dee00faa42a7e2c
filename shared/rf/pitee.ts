/**
 * Pi (shunt, series, shunt) and tee (series, shunt, series) networks for a chosen loaded Q, each built
 * as two back-to-back L-sections through a virtual resistance R_v (common practice; e.g. Bowick, RF
 * Circuit Design, ch. 4, from memory):
 * - pi: R_v = R_high/(1 + Q²) below both sides' parallel-equivalent resistances R_p = |Z|²/R;
 *   needs Q ≥ √(R_high/R_low − 1).
 * - tee: R_v = R_low·(1 + Q²) above both sides' series resistances; needs Q ≥ √(R_high/R_low − 1).
 * The two middle elements of the same placement merge into one. Every sign combination is returned.
 */
import type { Complex } from './design';
import { lSectionsSeriesAtLoad, lSectionsShuntAtLoad } from './lsection';
import { reactiveStepsMerged, type ReactiveStep } from './match-steps';

export type PiTeeForm = 'pi' | 'tee';

export interface PiTeeSolution {
  readonly form: PiTeeForm;
  readonly q: number;
  readonly virtualOhms: number;
  /** Chain order, load -> port. */
  readonly steps: readonly ReactiveStep[];
}

function parallelResistance(z: Complex): number {
  return (z[0] * z[0] + z[1] * z[1]) / z[0];
}

/** The smallest loaded Q a pi or tee network can have between these two impedances (that of an L-section). */
export function piTeeMinimumQ(form: PiTeeForm, zLoad: Complex, zTarget: Complex): number {
  const [a, b] = form === 'pi' ? [parallelResistance(zLoad), parallelResistance(zTarget)] : [zLoad[0], zTarget[0]];
  return Math.sqrt(Math.max(a, b) / Math.min(a, b) - 1);
}

function combine(form: PiTeeForm, q: number, rv: number, first: readonly ReactiveStep[][], second: readonly ReactiveStep[][], scale: number): PiTeeSolution[] {
  const out: PiTeeSolution[] = [];
  for (const f of first) for (const s of second) out.push({ form, q, virtualOhms: rv, steps: reactiveStepsMerged([...f, ...s], scale) });
  return out;
}

/** Pi networks with loaded Q `q` from `zLoad` to `zTarget`; empty when `q` is below the minimum. */
export function piNetworks(zLoad: Complex, zTarget: Complex, q: number): PiTeeSolution[] {
  if (!(zLoad[0] > 0) || !(zTarget[0] > 0) || !(q > 0)) return [];
  const rpl = parallelResistance(zLoad);
  const rpt = parallelResistance(zTarget);
  const rv = Math.max(rpl, rpt) / (1 + q * q);
  if (rv > Math.min(rpl, rpt) * (1 + 1e-12)) return [];
  const first = lSectionsShuntAtLoad(zLoad, [rv, 0]).map((s) => [...s.steps]);
  const second = lSectionsSeriesAtLoad([rv, 0], zTarget).map((s) => [...s.steps]);
  return combine('pi', q, rv, first, second, Math.hypot(zTarget[0], zTarget[1]));
}

/** Tee networks with loaded Q `q` from `zLoad` to `zTarget`; empty when `q` is below the minimum. */
export function teeNetworks(zLoad: Complex, zTarget: Complex, q: number): PiTeeSolution[] {
  if (!(zLoad[0] > 0) || !(zTarget[0] > 0) || !(q > 0)) return [];
  const rv = Math.min(zLoad[0], zTarget[0]) * (1 + q * q);
  if (rv < Math.max(zLoad[0], zTarget[0]) * (1 - 1e-12)) return [];
  const first = lSectionsSeriesAtLoad(zLoad, [rv, 0]).map((s) => [...s.steps]);
  const second = lSectionsShuntAtLoad([rv, 0], zTarget).map((s) => [...s.steps]);
  return combine('tee', q, rv, first, second, Math.hypot(zTarget[0], zTarget[1]));
}
