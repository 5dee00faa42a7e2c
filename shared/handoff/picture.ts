/**
 * Shared pieces of the report's pictures: a box, polyline decimation and nice axis ticks. Pure.
 */

export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

/**
 * At most `max` points of an interleaved x, y polyline, keeping the first and the last: evenly strided,
 * which is enough for the smooth traces the pictures draw.
 */
export function decimatePolyline(points: readonly number[], max = 1200): number[] {
  const n = points.length >> 1;
  if (n <= max) return points.slice();
  const out: number[] = [];
  const step = (n - 1) / (max - 1);
  for (let k = 0; k < max; k++) {
    const i = Math.round(k * step);
    out.push(points[2 * i], points[2 * i + 1]);
  }
  return out;
}

/** Tick values between lo and hi at a 1, 2 or 5 × 10^k step nearest (hi − lo)/count (common practice). */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  if (!(hi > lo) || !Number.isFinite(lo) || !Number.isFinite(hi)) return Number.isFinite(lo) ? [lo] : [];
  const raw = (hi - lo) / Math.max(1, count);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const norm = raw / mag;
  const step = (norm < 1.5 ? 1 : norm < 3 ? 2 : norm < 7 ? 5 : 10) * mag;
  const out: number[] = [];
  const first = Math.ceil(lo / step - 1e-9);
  for (let k = first; k * step <= hi + step * 1e-9; k++) out.push(Number((k * step).toPrecision(12)));
  return out;
}

/** Tick label: no float noise, no trailing zeros. */
export function tickText(v: number): string {
  return String(Number(v.toPrecision(6)));
}
