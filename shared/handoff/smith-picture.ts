/**
 * The Smith chart of the report as plain vector data in a square box (y down, like a page or a
 * canvas): the impedance grid (circles, to be clipped to the rim by the drawing code), the goal's
 * VSWR circle, the impedance path element by element tinted by kind, the stage markers, and the band
 * trace (thick in band, thin outside) with its band edges and centre marked. Pure: the PDF report
 * draws exactly this, and a client picture could too.
 *
 * Γ = u + jv maps to (cx + u·R, cy − v·R): the same convention as the workspace chart's geometry.
 */
import type { AnalysisResult } from '../rf/analyze';
import { bandCenterHz, type Design } from '../rf/design';
import type { ImpedancePath } from '../rf/impedance-path';
import { kindFamily, kindPaint, REPORT_PALETTE, type KindFamily, type Paint } from './palette';
import { decimatePolyline, type Box } from './picture';

export interface PictureCircle {
  x: number;
  y: number;
  r: number;
  paint: Paint;
  width: number;
  role: 'rim' | 'r' | 'x';
  value: number;
}

export interface PictureLabel {
  text: string;
  x: number;
  y: number;
  align: 'left' | 'center' | 'right';
  paint: Paint;
}

export interface PathStroke {
  id: string;
  kind: string;
  family: KindFamily;
  paint: Paint;
  /** interleaved x, y */
  points: number[];
}

export interface Marker {
  role: 'load' | 'stage' | 'port' | 'band-start' | 'band-stop' | 'centre';
  x: number;
  y: number;
  paint: Paint;
}

export interface SmithPicture {
  box: Box;
  frame: { cx: number; cy: number; radius: number };
  circles: PictureCircle[];
  axis: [number, number, number, number];
  labels: PictureLabel[];
  goal: { x: number; y: number; r: number; paint: Paint } | null;
  path: PathStroke[];
  markers: Marker[];
  trace: { inBand: number[]; outside: number[][]; paint: Paint; outsidePaint: Paint } | null;
}

export const SMITH_MAJOR = [0.2, 0.5, 1, 2, 5] as const;
export const SMITH_MINOR = [0.1, 0.3, 0.4, 0.7, 1.5, 3, 10] as const;

/** Largest |Γ| drawn; an active or odd point is pulled back to just outside the rim. */
const MAX_MAGNITUDE = 1.02;

function clampGamma(u: number, v: number): [number, number] {
  const m = Math.hypot(u, v);
  if (!Number.isFinite(m)) return [1, 0];
  return m > MAX_MAGNITUDE ? [(u / m) * MAX_MAGNITUDE, (v / m) * MAX_MAGNITUDE] : [u, v];
}

export function smithPoint(frame: SmithPicture['frame'], u: number, v: number): [number, number] {
  const [a, b] = clampGamma(u, v);
  return [frame.cx + a * frame.radius, frame.cy - b * frame.radius];
}

const short = (v: number) => String(Number(v.toPrecision(3)));

/** Γ of a sweep, linearly interpolated at `hz` (the sweep is ascending). */
export function gammaAtFrequency(freqs: Float64Array, gamma: Float64Array, hz: number): [number, number] | null {
  const n = freqs.length;
  if (n === 0 || hz < freqs[0] || hz > freqs[n - 1]) return null;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (freqs[mid] <= hz) lo = mid;
    else hi = mid;
  }
  const span = freqs[hi] - freqs[lo];
  const t = span > 0 ? (hz - freqs[lo]) / span : 0;
  return [gamma[2 * lo] + t * (gamma[2 * hi] - gamma[2 * lo]), gamma[2 * lo + 1] + t * (gamma[2 * hi + 1] - gamma[2 * lo + 1])];
}

export function smithPicture(box: Box, design: Design, result: AnalysisResult, path: ImpedancePath | null, margin = 16): SmithPicture {
  const size = Math.min(box.width, box.height);
  const radius = size / 2 - margin;
  const frame = { cx: box.x + box.width / 2, cy: box.y + box.height / 2, radius };
  const px = (u: number, v: number) => smithPoint(frame, u, v);

  const circles: PictureCircle[] = [];
  const labels: PictureLabel[] = [];
  for (const [values, major] of [
    [SMITH_MINOR, false],
    [SMITH_MAJOR, true],
  ] as const) {
    const paint = major ? REPORT_PALETTE.gridMajor : REPORT_PALETTE.gridMinor;
    const width = major ? 0.6 : 0.4;
    for (const v of values) {
      circles.push({ x: frame.cx + (v / (1 + v)) * radius, y: frame.cy, r: radius / (1 + v), paint, width, role: 'r', value: v });
      for (const sign of [1, -1]) circles.push({ x: frame.cx + radius, y: frame.cy - (sign / v) * radius, r: radius / v, paint, width, role: 'x', value: sign * v });
    }
  }
  for (const v of SMITH_MAJOR) {
    const [rx, ry] = px((v - 1) / (v + 1), 0);
    labels.push({ text: short(v), x: rx + 1.5, y: ry - 7.5, align: 'left', paint: REPORT_PALETTE.gridLabel });
    for (const sign of [1, -1]) {
      // z = j·x on the rim: Γ = (x² − 1 + 2jx)/(x² + 1)
      const x = sign * v;
      const u = (x * x - 1) / (x * x + 1);
      const w = (2 * x) / (x * x + 1);
      // Just outside the rim (not clamped like the traces).
      const lx = frame.cx + u * (radius + 8.5);
      const ly = frame.cy - w * (radius + 7.5);
      labels.push({ text: `${sign < 0 ? '−' : '+'}j${short(v)}`, x: lx, y: ly - 3.5, align: 'center', paint: REPORT_PALETTE.gridLabel });
    }
  }
  circles.unshift({ x: frame.cx, y: frame.cy, r: radius, paint: REPORT_PALETTE.ink, width: 1.1, role: 'rim', value: 0 });

  const goal = result.maxGamma > 0 && result.maxGamma < 1 ? { x: frame.cx, y: frame.cy, r: result.maxGamma * radius, paint: REPORT_PALETTE.goal } : null;

  const strokes: PathStroke[] = [];
  const markers: Marker[] = [];
  if (path) {
    const [lx, ly] = px(path.load[0], path.load[1]);
    markers.push({ role: 'load', x: lx, y: ly, paint: REPORT_PALETTE.ink });
    path.segments.forEach((seg, k) => {
      const pts: number[] = [];
      for (let i = 0; i < seg.gamma.length; i += 2) pts.push(...px(seg.gamma[i], seg.gamma[i + 1]));
      strokes.push({ id: seg.id, kind: seg.kind, family: kindFamily(seg.kind), paint: kindPaint(seg.kind), points: decimatePolyline(pts, 600) });
      const n = pts.length;
      if (n >= 2) markers.push({ role: k === path.segments.length - 1 ? 'port' : 'stage', x: pts[n - 2], y: pts[n - 1], paint: kindPaint(seg.kind) });
    });
  }

  let trace: SmithPicture['trace'] = null;
  const freqs = result.frequenciesHz;
  if (freqs.length > 0) {
    const { startHz, stopHz } = design.band;
    const inBand: number[] = [];
    const below: number[] = [];
    const above: number[] = [];
    const edgeStart = gammaAtFrequency(freqs, result.gamma, startHz);
    const edgeStop = gammaAtFrequency(freqs, result.gamma, stopHz);
    for (let i = 0; i < freqs.length; i++) {
      const f = freqs[i];
      const p = px(result.gamma[2 * i], result.gamma[2 * i + 1]);
      if (f < startHz) below.push(...p);
      else if (f > stopHz) above.push(...p);
      else inBand.push(...p);
    }
    // Join the pieces at the band edges so the trace is continuous.
    if (edgeStart) {
      const e = px(edgeStart[0], edgeStart[1]);
      below.push(...e);
      inBand.unshift(...e);
    }
    if (edgeStop) {
      const e = px(edgeStop[0], edgeStop[1]);
      inBand.push(...e);
      above.unshift(...e);
    }
    trace = {
      inBand: decimatePolyline(inBand),
      outside: [below, above].filter((p) => p.length >= 4).map((p) => decimatePolyline(p)),
      paint: REPORT_PALETTE.trace,
      outsidePaint: REPORT_PALETTE.traceOutOfBand,
    };
    // The centre is marked only without a path (the path's port marker sits there otherwise).
    const marks: [Marker['role'], [number, number] | null][] = [
      ['band-start', edgeStart],
      ['band-stop', edgeStop],
    ];
    if (!path || path.segments.length === 0) marks.push(['centre', gammaAtFrequency(freqs, result.gamma, bandCenterHz(design.band))]);
    for (const [role, g] of marks) if (g) markers.push({ role, x: px(g[0], g[1])[0], y: px(g[0], g[1])[1], paint: REPORT_PALETTE.traceDeep });
  }

  const [ax0, ay] = px(-1, 0);
  const [ax1] = px(1, 0);
  return { box, frame, circles, axis: [ax0, ay, ax1, ay], labels, goal, path: strokes, markers, trace };
}
