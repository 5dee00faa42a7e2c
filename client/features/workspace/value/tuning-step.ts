/**
 * Tuning steps: how far one arrow-key press, wheel notch or few pixels of drag move a value.
 *
 * L, C, R, ratios and physical lengths step by a fraction of themselves (log-scaled, so 1 nH and
 * 100 nH feel the same under the mouse); electrical lengths in degrees step by fixed amounts.
 * Shift makes a step coarse, Alt fine. With E-series stepping a step goes to the next preferred
 * value up or down (Shift: three of them at once).
 */
import { nextPreferredDown, nextPreferredUp, type ESeries } from '../../../../shared/rf/eseries';

export type StepSize = 'fine' | 'normal' | 'coarse';

/** Relative change per step on a log scale. */
export const LOG_STEP: Record<StepSize, number> = { fine: 0.002, normal: 0.02, coarse: 0.1 };
/** Degrees per step for electrical lengths. */
export const DEGREE_STEP: Record<StepSize, number> = { fine: 0.1, normal: 1, coarse: 10 };
/** Preferred values per step in E-series mode. */
export const PREFERRED_STEP: Record<StepSize, number> = { fine: 1, normal: 1, coarse: 3 };
/** Vertical drag: pixels per step. */
export const DRAG_PIXELS_PER_STEP = 4;

export interface StepOptions {
  scale: 'log' | 'linear';
  size: StepSize;
  /** step through this E-series instead (only for values where that makes sense) */
  series?: ESeries | null;
}

export function stepSizeFromModifiers(e: { shiftKey?: boolean; altKey?: boolean }): StepSize {
  if (e.shiftKey) return 'coarse';
  if (e.altKey) return 'fine';
  return 'normal';
}

/** Keeps tuned values tidy in the document: four significant figures (log) or 0.01° (linear). */
export function tidyValue(value: number, scale: 'log' | 'linear'): number {
  if (!Number.isFinite(value)) return value;
  if (scale === 'linear') return Math.round(value * 100) / 100;
  return value === 0 ? 0 : Number(value.toPrecision(4));
}

/**
 * `value` moved by `steps` (signed).
 * Never returns zero, a negative or a non-finite number for a log scale; a linear (degree)
 * value stops at zero.
 */
export function stepValue(value: number, steps: number, opts: StepOptions): number {
  if (!Number.isFinite(value) || steps === 0) return value;
  if (opts.series && opts.scale === 'log') {
    const count = Math.trunc(steps) * PREFERRED_STEP[opts.size];
    let v = value;
    for (let i = 0; i < Math.abs(count); i++) {
      const next = preferredNeighbour(v, count > 0, opts.series);
      if (next === null) break;
      v = next;
    }
    return v;
  }
  if (opts.scale === 'log') {
    if (value <= 0) return value;
    const next = tidyValue(value * Math.pow(1 + LOG_STEP[opts.size], steps), 'log');
    return Number.isFinite(next) && next > 0 ? next : value;
  }
  return Math.max(0, tidyValue(value + steps * DEGREE_STEP[opts.size], 'linear'));
}

/** The next preferred value up or down, or null past the end of the tables. */
function preferredNeighbour(value: number, up: boolean, series: ESeries): number | null {
  try {
    const next = up ? nextPreferredUp(value, series) : nextPreferredDown(value, series);
    return Number.isFinite(next) && next > 0 ? next : null;
  } catch {
    return null;
  }
}

/**
 * Whole steps for a vertical drag of `dy` pixels (screen y grows downward; dragging up increases):
 * the value moves in the same steps as the arrow keys, so a drag lands on the same tidy values.
 */
export function dragSteps(dy: number): number {
  return Math.round(-dy / DRAG_PIXELS_PER_STEP) || 0;
}

/** Steps for one wheel event (one notch per event, whatever the device reports). */
export function wheelSteps(deltaY: number): number {
  if (deltaY === 0) return 0;
  return deltaY < 0 ? 1 : -1;
}
