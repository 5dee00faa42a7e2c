/**
 * Two-element L-sections that bring a load impedance to a target impedance at one frequency.
 *
 * The target is the impedance the chain must present at the port for a perfect match: for a port of
 * impedance Zs that is Zs* (power-wave reflection, CONTRACT §1), simply Z0 for a real port.
 *
 * Two placements (Pozar, Microwave Engineering, §5.1, from memory):
 * - shunt at load, then series: Y1 = G_L + j b with Re(1/Y1) = R_t, i.e. b² = G_L/R_t − G_L²;
 *   solvable when G_L·R_t ≤ 1, which for a real target is R_L² + X_L² ≥ Z0·R_L (not merely R_L > Z0).
 * - series at load, then shunt: Z1 = R_L + j x with Re(1/Z1) = G_t, i.e. x² = R_L/G_t − R_L²;
 *   solvable when R_L·G_t ≤ 1, which for a real target is R_L ≤ Z0.
 * Each has two signs of the root, so a load can have four solutions. A root where one element is zero
 * is returned with that element removed (a single series or shunt element).
 */
import type { Complex } from './design';
import { reactiveStepsMerged, type ReactiveStep } from './match-steps';

export type LSectionPlacement = 'shunt-at-load' | 'series-at-load';

export interface LSectionSolution {
  readonly placement: LSectionPlacement;
  /** Chain order, load -> port; one or two steps (a vanishing element is dropped). */
  readonly steps: readonly ReactiveStep[];
}

/** Relative size under which a negative discriminant is taken as zero (a tangent solution). */
const TANGENT = 1e-12;

/** Roots ±√d of a discriminant, one root when it is (numerically) zero, none when negative. */
function rootsOf(d: number, scale: number): number[] {
  if (d < -TANGENT * scale) return [];
  if (d <= TANGENT * scale) return [0];
  const r = Math.sqrt(d);
  return [r, -r];
}

/** Shunt element at the load, then a series element, bringing `zLoad` to `zTarget`. */
export function lSectionsShuntAtLoad(zLoad: Complex, zTarget: Complex): LSectionSolution[] {
  const [rl, xl] = zLoad;
  const [rt, xt] = zTarget;
  if (!(rl > 0) || !(rt > 0)) return [];
  const m2 = rl * rl + xl * xl;
  const g = rl / m2;
  const bl = -xl / m2;
  const d = g / rt - g * g;
  const scale = Math.max(g / rt, g * g);
  return rootsOf(d, scale).map((b) => {
    const steps: ReactiveStep[] = [
      { place: 'shunt', b: b - bl },
      { place: 'series', x: xt + b / (g * g + b * b) },
    ];
    return { placement: 'shunt-at-load' as const, steps: reactiveStepsMerged(steps, Math.hypot(rt, xt)) };
  });
}

/** Series element at the load, then a shunt element, bringing `zLoad` to `zTarget`. */
export function lSectionsSeriesAtLoad(zLoad: Complex, zTarget: Complex): LSectionSolution[] {
  const [rl, xl] = zLoad;
  const [rt, xt] = zTarget;
  if (!(rl > 0) || !(rt > 0)) return [];
  const mt2 = rt * rt + xt * xt;
  const gt = rt / mt2;
  const bt = -xt / mt2;
  const d = rl / gt - rl * rl;
  const scale = Math.max(rl / gt, rl * rl);
  return rootsOf(d, scale).map((x) => {
    const steps: ReactiveStep[] = [
      { place: 'series', x: x - xl },
      { place: 'shunt', b: bt + x / (rl * rl + x * x) },
    ];
    return { placement: 'series-at-load' as const, steps: reactiveStepsMerged(steps, Math.hypot(rt, xt)) };
  });
}

/** Every L-section (both placements, both signs) from `zLoad` to `zTarget`. */
export function lSections(zLoad: Complex, zTarget: Complex): LSectionSolution[] {
  return [...lSectionsShuntAtLoad(zLoad, zTarget), ...lSectionsSeriesAtLoad(zLoad, zTarget)];
}
