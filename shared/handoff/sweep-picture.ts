/**
 * The sweep plot of the report as plain vector data in a box (y down): return loss in dB against
 * frequency, the goal line, the band shaded, the bandwidth edges, axes with ticks. Pure; the PDF report
 * draws exactly this.
 */
import type { AnalysisResult } from '../rf/analyze';
import { goalMaxGamma, type Design } from '../rf/design';
import { REPORT_PALETTE, type Paint } from './palette';
import { niceTicks, tickText, type Box } from './picture';

/** Return loss is drawn up to this (a perfect match would otherwise run off to 300 dB). */
export const REPORT_RETURN_LOSS_CEILING_DB = 40;

export interface Tick {
  value: number;
  text: string;
  /** position along the axis (x for the frequency axis, y for the return-loss axis) */
  at: number;
}

export interface SweepPicture {
  box: Box;
  plot: Box;
  unit: { scale: number; label: 'Hz' | 'kHz' | 'MHz' | 'GHz' };
  xTicks: Tick[];
  yTicks: Tick[];
  xLabel: string;
  yLabel: string;
  /** interleaved x, y; values above the ceiling are drawn at the top edge */
  trace: number[];
  tracePaint: Paint;
  band: { x0: number; x1: number; paint: Paint } | null;
  goal: { y: number; db: number; text: string; paint: Paint } | null;
  bandwidthEdges: { x: number; hz: number }[];
  yRange: [number, number];
}

export function frequencyUnitFor(maxHz: number): SweepPicture['unit'] {
  if (maxHz >= 1e9) return { scale: 1e9, label: 'GHz' };
  if (maxHz >= 1e6) return { scale: 1e6, label: 'MHz' };
  if (maxHz >= 1e3) return { scale: 1e3, label: 'kHz' };
  return { scale: 1, label: 'Hz' };
}

/** Return loss (dB, ≥ 0) of a reflection magnitude, held to [0, ceiling]. */
function plottedDb(mag: number, ceiling: number): number {
  if (!(mag > 0)) return ceiling;
  return Math.min(ceiling, Math.max(0, -20 * Math.log10(Math.min(1, mag))));
}

/** Min/max per pixel column, in index order, so sharp dips survive decimation. */
function columnEnvelope(xs: Float64Array, ys: Float64Array, columns: number): number[] {
  const n = xs.length;
  if (n <= 2 * columns) {
    const out: number[] = [];
    for (let i = 0; i < n; i++) out.push(xs[i], ys[i]);
    return out;
  }
  const out: number[] = [];
  const per = n / columns;
  for (let c = 0; c < columns; c++) {
    const a = Math.floor(c * per);
    const b = Math.min(n, Math.floor((c + 1) * per));
    if (b <= a) continue;
    let iMin = a;
    let iMax = a;
    for (let i = a; i < b; i++) {
      if (ys[i] < ys[iMin]) iMin = i;
      if (ys[i] > ys[iMax]) iMax = i;
    }
    const [first, second] = iMin < iMax ? [iMin, iMax] : [iMax, iMin];
    out.push(xs[first], ys[first]);
    if (second !== first) out.push(xs[second], ys[second]);
  }
  return out;
}

export function sweepPicture(box: Box, design: Design, result: AnalysisResult): SweepPicture {
  const plot: Box = { x: box.x + 34, y: box.y + 8, width: box.width - 44, height: box.height - 38 };
  const freqs = result.frequenciesHz;
  const n = freqs.length;
  const f0 = n ? freqs[0] : design.sweep.startHz;
  const f1 = n ? freqs[n - 1] : design.sweep.stopHz;
  const unit = frequencyUnitFor(Math.max(f0, f1));
  const xLo = f0 / unit.scale;
  const xHi = f1 > f0 ? f1 / unit.scale : xLo + 1;
  const xAt = (hz: number) => plot.x + ((hz / unit.scale - xLo) / (xHi - xLo)) * plot.width;

  const maxGamma = goalMaxGamma(design.goal);
  const goalDb = -20 * Math.log10(maxGamma);
  const ceiling = REPORT_RETURN_LOSS_CEILING_DB;
  let best = 0;
  for (let i = 0; i < n; i++) best = Math.max(best, plottedDb(result.gammaMagnitude[i], ceiling));
  const top = Math.min(ceiling, Math.ceil((Math.max(best, goalDb * 1.5, 10) + 2) / 5) * 5);
  const yAt = (db: number) => plot.y + plot.height - (Math.min(top, Math.max(0, db)) / top) * plot.height;

  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    xs[i] = xAt(freqs[i]);
    ys[i] = yAt(plottedDb(result.gammaMagnitude[i], ceiling));
  }
  const trace = columnEnvelope(xs, ys, Math.max(50, Math.round(plot.width * 2)));

  const clampX = (x: number) => Math.min(plot.x + plot.width, Math.max(plot.x, x));
  const { startHz, stopHz } = design.band;
  const band = stopHz >= f0 && startHz <= f1 ? { x0: clampX(xAt(startHz)), x1: clampX(xAt(stopHz)), paint: REPORT_PALETTE.band } : null;
  const vswr = (1 + maxGamma) / (1 - maxGamma);
  const goal =
    goalDb > 0 && goalDb <= top
      ? { y: yAt(goalDb), db: goalDb, text: `goal ${goalDb.toFixed(1)} dB (VSWR ${String(Number(vswr.toPrecision(3)))})`, paint: REPORT_PALETTE.goal }
      : null;
  const bandwidthEdges = result.bandwidth
    ? [result.bandwidth.lowHz, result.bandwidth.highHz].filter((hz) => hz > f0 && hz < f1).map((hz) => ({ x: xAt(hz), hz }))
    : [];

  const xTicks = niceTicks(xLo, xHi, Math.max(3, Math.round(plot.width / 55))).map((v) => ({ value: v, text: tickText(v), at: xAt(v * unit.scale) }));
  const yTicks = niceTicks(0, top, Math.max(3, Math.round(plot.height / 28))).map((v) => ({ value: v, text: tickText(v), at: yAt(v) }));

  return {
    box,
    plot,
    unit,
    xTicks,
    yTicks,
    xLabel: `Frequency (${unit.label})`,
    yLabel: 'Return loss (dB)',
    trace,
    tracePaint: REPORT_PALETTE.trace,
    band,
    goal,
    bandwidthEdges,
    yRange: [0, top],
  };
}
