/**
 * The moving part of the Smith chart as plain data (pixels): the goal's VSWR circle, the impedance
 * path element by element, the stage markers, the band trace with its band edges and centre, the
 * yield envelope, the compare and preview overlays and other people's cursors. Pure; the chart's
 * dynamic Konva layer draws exactly this, and the tests check it.
 */
import { bandCenterHz, goalMaxGamma, type Design } from '../../../../shared/rf/design';
import type { AnalysisResult, ImpedancePath } from '../analysis/engine-types';
import { pathRunsOf, pathStartOf } from '../analysis/path-adapter';
import { CHART_PALETTE, elementKindColour } from './chart-palette';
import { gammaToPixel, viewFrame, type ChartView, type Frame } from './geometry';

export interface PathStroke {
  elementId: string;
  kind: string;
  colour: string;
  /** flat pixel list x0, y0, x1, y1, ... */
  points: number[];
  selected: boolean;
}

export interface StageMarker {
  /** "load" or an element id */
  after: string;
  x: number;
  y: number;
  colour: string;
  role: 'load' | 'stage' | 'port';
}

export interface BandMark {
  role: 'start' | 'stop' | 'centre';
  hz: number;
  x: number;
  y: number;
}

export interface TraceLine {
  /** in-band part, drawn thick */
  inBand: number[];
  /** below and above the band, drawn thin */
  outside: number[][];
}

export interface Overlay {
  label: string;
  trace: TraceLine | null;
  path: number[][];
}

export interface CursorMark {
  userId: string;
  name: string;
  colour: string;
  x: number;
  y: number;
}

/** Another person's selected element: its stage of the impedance path, in their presence colour. */
export interface PeerSelectionMark {
  elementId: string;
  userId: string;
  name: string;
  colour: string;
  points: number[];
}

export interface TraceModel {
  frame: Frame;
  goal: { x: number; y: number; r: number; gamma: number } | null;
  envelope: number[] | null;
  path: PathStroke[];
  stages: StageMarker[];
  trace: TraceLine | null;
  bandMarks: BandMark[];
  compare: Overlay | null;
  preview: Overlay | null;
  cursors: CursorMark[];
  peerSelections: PeerSelectionMark[];
  /** for hit testing: pixel positions (interleaved) of every sweep point and their frequencies */
  hit: { pixels: Float64Array; hz: Float64Array } | null;
}

export interface TraceInput {
  width: number;
  height: number;
  view?: ChartView;
  design: Design | null;
  result: AnalysisResult | null;
  path: ImpedancePath | null;
  selectedElementId?: string | null;
  envelope?: { minGamma: Float64Array; maxGamma: Float64Array } | null;
  compare?: { result: AnalysisResult; path: ImpedancePath | null; label: string } | null;
  preview?: { result: AnalysisResult; path: ImpedancePath | null } | null;
  cursors?: { userId: string; name: string; color: string; gamma: [number, number] }[];
  /** other people's selections (element ids), drawn on their stage of the path */
  peerSelections?: { userId: string; name: string; color: string; elementId: string }[];
}

/** Reference impedance of the chart: the design's referenceOhms (50 Ω when there is no design yet). */
export function chartZ0(design: Design | null): number {
  return design?.referenceOhms ?? 50;
}

/** Γ (interleaved) of every sweep point, against the chart's z0, from the result's input impedances. */
export function traceGammas(result: AnalysisResult, z0: number): Float64Array {
  const n = result.frequenciesHz.length;
  const out = new Float64Array(2 * n);
  const zin = result.zin;
  for (let i = 0; i < n; i++) {
    const r = zin[2 * i];
    const x = zin[2 * i + 1];
    if (!Number.isFinite(r) || !Number.isFinite(x)) {
      out[2 * i] = 1;
      out[2 * i + 1] = 0;
      continue;
    }
    const nr = r - z0;
    const dr = r + z0;
    const den = dr * dr + x * x;
    out[2 * i] = den === 0 ? -1 : (nr * dr + x * x) / den;
    out[2 * i + 1] = den === 0 ? 0 : (x * (dr - nr)) / den;
  }
  return out;
}

/** Γ at `hz` by linear interpolation between sweep points, or null outside the sweep. */
export function gammaAtHz(hzs: Float64Array, gammas: Float64Array, hz: number): [number, number] | null {
  const n = hzs.length;
  if (n === 0 || hz < hzs[0] || hz > hzs[n - 1]) return null;
  if (n === 1) return [gammas[0], gammas[1]];
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (hzs[mid] <= hz) lo = mid;
    else hi = mid;
  }
  const span = hzs[hi] - hzs[lo];
  const t = span > 0 ? (hz - hzs[lo]) / span : 0;
  return [gammas[2 * lo] + t * (gammas[2 * hi] - gammas[2 * lo]), gammas[2 * lo + 1] + t * (gammas[2 * hi + 1] - gammas[2 * lo + 1])];
}

function traceLine(hzs: Float64Array, gammas: Float64Array, f: Frame, band: { startHz: number; stopHz: number } | null): TraceLine {
  const n = hzs.length;
  const low: number[] = [];
  const inBand: number[] = [];
  const high: number[] = [];
  const put = (arr: number[], g: readonly [number, number]) => {
    const [x, y] = gammaToPixel(g, f);
    arr.push(x, y);
  };
  const start = band ? gammaAtHz(hzs, gammas, band.startHz) : null;
  const stop = band ? gammaAtHz(hzs, gammas, band.stopHz) : null;
  for (let i = 0; i < n; i++) {
    const hz = hzs[i];
    const g: [number, number] = [gammas[2 * i], gammas[2 * i + 1]];
    if (!band) put(inBand, g);
    else if (hz < band.startHz) put(low, g);
    else if (hz > band.stopHz) put(high, g);
    else put(inBand, g);
  }
  if (band) {
    // join the pieces at the interpolated band edges so the thick and thin parts meet
    if (start) {
      put(low, start);
      inBand.unshift(...gammaToPixel(start, f));
    }
    if (stop) {
      inBand.push(...gammaToPixel(stop, f));
      high.unshift(...gammaToPixel(stop, f));
    }
  }
  return { inBand, outside: [low, high].filter((p) => p.length >= 4) };
}

/** The path's Γ points are on the path's own reference; the chart's z0 is the same (referenceOhms). */
function pathStrokes(path: ImpedancePath, f: Frame, selected: string | null | undefined): PathStroke[] {
  return pathRunsOf(path).map((s) => {
    const pts: number[] = [];
    for (let i = 0; i + 1 < s.gamma.length; i += 2) {
      const [x, y] = gammaToPixel([s.gamma[i], s.gamma[i + 1]], f);
      pts.push(x, y);
    }
    return { elementId: s.elementId, kind: s.kind, colour: elementKindColour(s.kind), points: pts, selected: s.elementId === selected };
  });
}

function overlay(result: AnalysisResult, path: ImpedancePath | null, label: string, design: Design | null, f: Frame): Overlay {
  const z0 = chartZ0(design);
  return {
    label,
    trace: result.frequenciesHz.length ? traceLine(result.frequenciesHz, traceGammas(result, z0), f, design?.band ?? null) : null,
    path: path ? pathStrokes(path, f, null).map((s) => s.points) : [],
  };
}

/** The yield envelope as a closed polygon: along each in-sweep point's direction, from min |Γ| out to max |Γ|. */
function envelopePolygon(gammas: Float64Array, env: { minGamma: Float64Array; maxGamma: Float64Array }, f: Frame): number[] | null {
  const n = Math.min(gammas.length / 2, env.minGamma.length, env.maxGamma.length);
  if (n < 2) return null;
  const outer: number[] = [];
  const inner: number[] = [];
  for (let i = 0; i < n; i++) {
    const u = gammas[2 * i];
    const v = gammas[2 * i + 1];
    const m = Math.hypot(u, v);
    const cu = m > 1e-12 ? u / m : 1;
    const cv = m > 1e-12 ? v / m : 0;
    const lo = Math.max(0, Math.min(1, env.minGamma[i]));
    const hi = Math.max(lo, Math.min(1, env.maxGamma[i]));
    if (!Number.isFinite(lo) || !Number.isFinite(hi)) continue;
    const [ox, oy] = gammaToPixel([cu * hi, cv * hi], f);
    const [ix, iy] = gammaToPixel([cu * lo, cv * lo], f);
    outer.push(ox, oy);
    inner.push(ix, iy);
  }
  const poly = outer;
  for (let i = inner.length - 2; i >= 0; i -= 2) poly.push(inner[i], inner[i + 1]);
  return poly.length >= 6 ? poly : null;
}

export function buildTraceModel(input: TraceInput): TraceModel {
  const f = viewFrame(input.width, input.height, input.view);
  const { design, result, path } = input;
  const z0 = chartZ0(design);

  let goal: TraceModel['goal'] = null;
  if (design) {
    const g = goalMaxGamma(design.goal);
    goal = { x: f.cx, y: f.cy, r: g * f.radius, gamma: g };
  }

  const strokes = path ? pathStrokes(path, f, input.selectedElementId) : [];
  const stages: StageMarker[] = [];
  if (path) {
    const start = pathStartOf(path);
    if (start) {
      const [x, y] = gammaToPixel(start, f);
      stages.push({ after: 'load', x, y, colour: CHART_PALETTE.ink, role: 'load' });
    }
    strokes.forEach((s, i) => {
      if (s.points.length < 2) return;
      const x = s.points[s.points.length - 2];
      const y = s.points[s.points.length - 1];
      stages.push({ after: s.elementId, x, y, colour: s.colour, role: i === strokes.length - 1 ? 'port' : 'stage' });
    });
  }

  let trace: TraceLine | null = null;
  let bandMarks: BandMark[] = [];
  let hit: TraceModel['hit'] = null;
  let envelope: number[] | null = null;
  if (result && result.frequenciesHz.length > 0) {
    const hzs = result.frequenciesHz;
    const gammas = traceGammas(result, z0);
    const band = design?.band ?? null;
    trace = traceLine(hzs, gammas, f, band);
    if (band) {
      const marks: [BandMark['role'], number][] = [
        ['start', band.startHz],
        ['stop', band.stopHz],
        ['centre', bandCenterHz(band)],
      ];
      bandMarks = marks.flatMap(([role, hz]) => {
        const g = gammaAtHz(hzs, gammas, hz);
        if (!g) return [];
        const [x, y] = gammaToPixel(g, f);
        return [{ role, hz, x, y }];
      });
    }
    const pixels = new Float64Array(gammas.length);
    for (let i = 0; i < gammas.length; i += 2) {
      pixels[i] = f.cx + gammas[i] * f.radius;
      pixels[i + 1] = f.cy - gammas[i + 1] * f.radius;
    }
    hit = { pixels, hz: hzs };
    if (input.envelope) envelope = envelopePolygon(gammas, input.envelope, f);
  }

  const cursors: CursorMark[] = (input.cursors ?? [])
    .filter((c) => Number.isFinite(c.gamma[0]) && Number.isFinite(c.gamma[1]))
    .map((c) => {
      const [x, y] = gammaToPixel(c.gamma, f);
      return { userId: c.userId, name: c.name, colour: c.color, x, y };
    });

  const peerSelections: PeerSelectionMark[] = (input.peerSelections ?? []).flatMap((p) => {
    const stroke = strokes.find((st) => st.elementId === p.elementId);
    return stroke && stroke.points.length >= 4
      ? [{ elementId: p.elementId, userId: p.userId, name: p.name, colour: p.color, points: stroke.points }]
      : [];
  });

  return {
    frame: f,
    goal,
    envelope,
    path: strokes,
    stages,
    trace,
    bandMarks,
    compare: input.compare ? overlay(input.compare.result, input.compare.path, input.compare.label, design, f) : null,
    preview: input.preview ? overlay(input.preview.result, input.preview.path, 'preview', design, f) : null,
    cursors,
    peerSelections,
    hit,
  };
}

/** The sweep point nearest to a pixel, within `maxDistance` pixels. */
export function nearestTracePoint(model: TraceModel, px: number, py: number, maxDistance = 10): { index: number; hz: number } | null {
  if (!model.hit) return null;
  const { pixels, hz } = model.hit;
  let best = -1;
  let bestD = maxDistance * maxDistance;
  for (let i = 0; i < hz.length; i++) {
    const dx = pixels[2 * i] - px;
    const dy = pixels[2 * i + 1] - py;
    const d = dx * dx + dy * dy;
    if (d < bestD || (best < 0 && d <= bestD)) {
      bestD = d;
      best = i;
    }
  }
  return best < 0 ? null : { index: best, hz: hz[best] };
}

function distanceToSegment(px: number, py: number, x0: number, y0: number, x1: number, y1: number): number {
  const dx = x1 - x0;
  const dy = y1 - y0;
  const len2 = dx * dx + dy * dy;
  const t = len2 > 0 ? Math.max(0, Math.min(1, ((px - x0) * dx + (py - y0) * dy) / len2)) : 0;
  return Math.hypot(px - (x0 + t * dx), py - (y0 + t * dy));
}

/** The impedance-path element under a pixel (within `maxDistance`), nearest first; null if none. */
export function pathElementAt(model: TraceModel, px: number, py: number, maxDistance = 7): string | null {
  let best: string | null = null;
  let bestD = maxDistance;
  for (const s of model.path) {
    const p = s.points;
    for (let i = 0; i + 3 < p.length; i += 2) {
      const d = distanceToSegment(px, py, p[i], p[i + 1], p[i + 2], p[i + 3]);
      if (d <= bestD) {
        bestD = d;
        best = s.elementId;
      }
    }
  }
  return best;
}
