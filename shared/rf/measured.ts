/**
 * Measured network data inside a design (a `.s1p` load, a `.s2p` two-port): parsed once per
 * text (a small cache keyed by the text), resampled onto a frequency grid, and every failure
 * turned into a `DesignError` that names the JSON path (`load.touchstone: line 7: ...`,
 * `elements[3].touchstone: sweep ... lies outside the measured range ...`).
 */
import { DesignError } from './design';
import { parseTouchstone, resampleTouchstone, type TouchstoneData } from './touchstone';

const CACHE_LIMIT = 16;
const parsed = new Map<string, TouchstoneData | DesignError>();

function reason(e: unknown): string {
  return (e instanceof Error ? e.message : String(e)).replace(/\s*\n\s*/g, ' ');
}

/** The parsed data of a Touchstone text with `ports` ports; throws DesignError at `path`. */
export function measuredData(text: string, ports: 1 | 2, path: string): TouchstoneData {
  const key = `${ports}\u0000${text}`;
  let hit = parsed.get(key);
  if (hit === undefined) {
    try {
      hit = parseTouchstone(text, { ports });
    } catch (e) {
      hit = new DesignError(path, reason(e));
    }
    if (parsed.size >= CACHE_LIMIT) parsed.delete(parsed.keys().next().value as string);
    parsed.set(key, hit);
  }
  if (hit instanceof DesignError) throw hit.path === path ? hit : new DesignError(path, hit.reason);
  return hit;
}

/** The data resampled onto `freqs` (linear in re, im); out of range -> DesignError naming the measured range. */
export function measuredResampled(data: TouchstoneData, freqs: Float64Array, path: string): Float64Array {
  try {
    return resampleTouchstone(data, freqs);
  } catch (e) {
    throw new DesignError(path, reason(e));
  }
}
