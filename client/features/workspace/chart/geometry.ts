/**
 * Smith-chart geometry: pure functions between impedances, the reflection-coefficient plane (Γ) and
 * canvas pixels. Γ = (z − z0)/(z + z0); the unit circle |Γ| = 1 is the chart's rim; +Im Γ points up.
 *
 * FOR THE WORKSPACE ENGINEER: `Frame` is { cx, cy, radius } in pixels: where Γ = 0 sits and how many
 * pixels |Γ| = 1 spans. `viewFrame(width, height, view)` turns the chart's { zoom, cx, cy } view (cx, cy
 * = the Γ point at the canvas centre) into a Frame.
 */

export type Pair = [number, number];

export interface Frame {
  cx: number;
  cy: number;
  radius: number;
}

export interface ChartView {
  zoom: number;
  cx: number;
  cy: number;
}

export const DEFAULT_VIEW: ChartView = { zoom: 1, cx: 0, cy: 0 };
export const MIN_ZOOM = 0.5;
export const MAX_ZOOM = 40;
/** pixels kept free between the rim and the canvas edge at zoom 1 (room for the rim labels) */
export const CHART_MARGIN = 26;

export function gammaToPixel(g: readonly [number, number], f: Frame): Pair {
  return [f.cx + g[0] * f.radius, f.cy - g[1] * f.radius];
}

export function pixelToGamma(p: readonly [number, number], f: Frame): Pair {
  return [(p[0] - f.cx) / f.radius, (f.cy - p[1]) / f.radius];
}

/** Γ of impedance z against a real reference z0. A non-finite part means an open circuit: Γ = 1. */
export function zToGamma(z: readonly [number, number], z0: number): Pair {
  const [r, x] = z;
  if (!Number.isFinite(r) || !Number.isFinite(x)) return [1, 0];
  const nr = r - z0;
  const dr = r + z0;
  const den = dr * dr + x * x;
  if (den === 0) return [-1, 0]; // z = −z0 cannot occur for a passive load; treat as a short
  // (nr + jx)/(dr + jx) = ((nr·dr + x²) + j x (dr − nr)) / den
  return [(nr * dr + x * x) / den, (x * (dr - nr)) / den];
}

/** Impedance for a Γ point; Γ = 1 is an open circuit and comes back as [Infinity, 0]. */
export function gammaToZ(g: readonly [number, number], z0: number): Pair {
  const [u, v] = g;
  const dr = 1 - u;
  const den = dr * dr + v * v;
  if (den < 1e-300) return [Infinity, 0];
  // z0 (1 + Γ)/(1 − Γ) = z0 ((1+u) + jv)((1−u) + jv)* / den
  const re = ((1 + u) * dr - v * v) / den;
  const im = (v * dr + (1 + u) * v) / den;
  return [z0 * re, z0 * im];
}

/** Admittance of a Γ point in siemens (Γ = −1 is a short: [Infinity, 0]). */
export function gammaToY(g: readonly [number, number], z0: number): Pair {
  const z = gammaToZ([-g[0], -g[1]], 1 / z0); // y/y0 = (1 − Γ)/(1 + Γ): the impedance formula at −Γ
  return z;
}

export function gammaMagnitude(g: readonly [number, number]): number {
  return Math.hypot(g[0], g[1]);
}

export function gammaAngleDeg(g: readonly [number, number]): number {
  return (Math.atan2(g[1], g[0]) * 180) / Math.PI;
}

export interface Circle {
  /** centre in the Γ plane */
  cx: number;
  cy: number;
  radius: number;
}

/** Constant normalised resistance r: centre (r/(1+r), 0), radius 1/(1+r). */
export function constantRCircle(r: number): Circle {
  return { cx: r / (1 + r), cy: 0, radius: 1 / (1 + r) };
}

/** Constant normalised reactance x (x ≠ 0): centre (1, 1/x), radius 1/|x|. */
export function constantXCircle(x: number): Circle {
  return { cx: 1, cy: 1 / x, radius: 1 / Math.abs(x) };
}

/** Constant normalised conductance g on the admittance grid: the r circle mirrored, centre (−g/(1+g), 0). */
export function constantGCircle(g: number): Circle {
  return { cx: -g / (1 + g), cy: 0, radius: 1 / (1 + g) };
}

/** Constant normalised susceptance b: the x circle mirrored through the origin, centre (−1, −1/b). */
export function constantBCircle(b: number): Circle {
  return { cx: -1, cy: -1 / b, radius: 1 / Math.abs(b) };
}

/**
 * Constant-Q locus Q = |x|/r. With Γ = u + jv, Q = 2|v|/(1 − u² − v²), so the upper arc lies on the
 * circle centre (0, −1/Q), radius √(1 + 1/Q²), and the lower arc on its mirror (derived from the
 * bilinear map; common practice).
 */
export function constantQCircle(q: number, half: 'upper' | 'lower'): Circle {
  return { cx: 0, cy: half === 'upper' ? -1 / q : 1 / q, radius: Math.sqrt(1 + 1 / (q * q)) };
}

/** The chart's pixel frame for a canvas size and a view. */
export function viewFrame(width: number, height: number, view: ChartView = DEFAULT_VIEW): Frame {
  const base = Math.max(10, Math.min(width, height) / 2 - CHART_MARGIN);
  const radius = base * view.zoom;
  return { cx: width / 2 - view.cx * radius, cy: height / 2 + view.cy * radius, radius };
}

/** The view after zooming by `factor` about a pixel, keeping the Γ point under that pixel fixed. */
export function zoomViewAt(width: number, height: number, view: ChartView, pixel: Pair, factor: number): ChartView {
  const zoom = Math.min(MAX_ZOOM, Math.max(MIN_ZOOM, view.zoom * factor));
  const g = pixelToGamma(pixel, viewFrame(width, height, view));
  const base = Math.max(10, Math.min(width, height) / 2 - CHART_MARGIN);
  const radius = base * zoom;
  // solve pixel = (W/2 − cx·R + g.u·R, H/2 + cy·R − g.v·R) for cx, cy
  const cx = g[0] - (pixel[0] - width / 2) / radius;
  const cy = g[1] + (pixel[1] - height / 2) / radius;
  return { zoom, cx, cy };
}

/** The view after dragging by (dx, dy) pixels. */
export function panView(width: number, height: number, view: ChartView, dx: number, dy: number): ChartView {
  const radius = viewFrame(width, height, view).radius;
  return { zoom: view.zoom, cx: view.cx - dx / radius, cy: view.cy + dy / radius };
}
