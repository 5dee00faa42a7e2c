/**
 * The sweep plot as plain data: x in MHz or GHz, the main trace (return loss as positive dB, or
 * VSWR), the compared trace, the yield envelope, the goal line, the band and the bandwidth edges,
 * and a y range. Pure; the uPlot component only draws this.
 */
import { bandCenterHz, goalMaxGamma, type Design } from '../../../../shared/rf/design';
import type { AnalysisResult } from '../analysis/engine-types';

export type SweepPlotMode = 'return-loss' | 'vswr';

/** Return loss shown at most this high (dB); a perfect match would otherwise run off to 300 dB. */
export const RETURN_LOSS_CEILING_DB = 60;
/** VSWR shown at most this high; total reflection draws along the top. */
export const VSWR_CEILING = 10;

export interface FrequencyUnit {
  scale: number;
  label: 'kHz' | 'MHz' | 'GHz';
}

export interface PlotModel {
  mode: SweepPlotMode;
  unit: FrequencyUnit;
  /** frequencies in `unit` */
  x: Float64Array;
  main: (number | null)[];
  compare: (number | null)[] | null;
  compareLabel: string | null;
  /** the envelope's better and worse edges in the plotted quantity (same x) */
  envelope: { best: (number | null)[]; worst: (number | null)[] } | null;
  goal: number | null;
  band: { start: number; stop: number; centre: number } | null;
  bandwidth: { low: number; high: number } | null;
  yRange: [number, number];
  yLabel: string;
  /** The y label for a plot too short for `yLabel` (the axis label is written along the plot's height). */
  yLabelShort: string;
  xLabel: string;
}

export function frequencyUnitFor(maxHz: number): FrequencyUnit {
  if (maxHz >= 1e9) return { scale: 1e9, label: 'GHz' };
  if (maxHz >= 1e6) return { scale: 1e6, label: 'MHz' };
  return { scale: 1e3, label: 'kHz' };
}

/** The plotted value for a reflection magnitude (finite: total reflection sits at the ceiling). */
export function plottedValue(gammaMag: number, mode: SweepPlotMode): number {
  if (!Number.isFinite(gammaMag)) return mode === 'vswr' ? VSWR_CEILING * 10 : 0;
  const g = Math.min(1, Math.max(0, gammaMag));
  if (mode === 'vswr') return g >= 1 - 1e-12 ? VSWR_CEILING * 10 : Math.min(VSWR_CEILING * 10, (1 + g) / (1 - g));
  return g <= 1e-15 ? 300 : g >= 1 ? 0 : -20 * Math.log10(g);
}

function series(mags: ArrayLike<number>, mode: SweepPlotMode): (number | null)[] {
  const out = new Array<number | null>(mags.length);
  for (let i = 0; i < mags.length; i++) out[i] = plottedValue(mags[i], mode);
  return out;
}

/** |Γ| of each sweep point from the result (the engine's own magnitudes where present). */
export function gammaMagnitudes(result: AnalysisResult): Float64Array {
  if (result.gammaMagnitude && result.gammaMagnitude.length === result.frequenciesHz.length) return result.gammaMagnitude;
  const n = result.frequenciesHz.length;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = Math.hypot(result.gamma[2 * i], result.gamma[2 * i + 1]);
  return out;
}

/** The compared trace on the main trace's frequencies (linear interpolation; null outside its sweep). */
function resampled(hz: Float64Array, other: AnalysisResult, mode: SweepPlotMode): (number | null)[] {
  const oh = other.frequenciesHz;
  const om = gammaMagnitudes(other);
  const out = new Array<number | null>(hz.length).fill(null);
  if (oh.length === 0) return out;
  let j = 0;
  for (let i = 0; i < hz.length; i++) {
    const f = hz[i];
    if (f < oh[0] || f > oh[oh.length - 1]) continue;
    while (j + 1 < oh.length - 1 && oh[j + 1] < f) j++;
    const k = Math.min(j + 1, oh.length - 1);
    const span = oh[k] - oh[j];
    const t = span > 0 ? Math.min(1, Math.max(0, (f - oh[j]) / span)) : 0;
    out[i] = plottedValue(om[j] + t * (om[k] - om[j]), mode);
  }
  return out;
}

function niceCeil(v: number, step: number): number {
  return Math.ceil(v / step) * step;
}

export interface PlotInput {
  design: Design | null;
  result: AnalysisResult | null;
  mode: SweepPlotMode;
  compare?: { result: AnalysisResult; label: string } | null;
  envelope?: { minGamma: Float64Array; maxGamma: Float64Array } | null;
}

export function buildPlotModel(input: PlotInput): PlotModel {
  const { design, result, mode } = input;
  const hz = result?.frequenciesHz ?? new Float64Array(0);
  const maxHz = hz.length ? hz[hz.length - 1] : (design?.sweep.stopHz ?? 1e9);
  const unit = frequencyUnitFor(maxHz);
  const x = new Float64Array(hz.length);
  for (let i = 0; i < hz.length; i++) x[i] = hz[i] / unit.scale;

  const mags = result ? gammaMagnitudes(result) : new Float64Array(0);
  const main = series(mags, mode);
  const compare = input.compare ? resampled(hz, input.compare.result, mode) : null;

  let envelope: PlotModel['envelope'] = null;
  const env = input.envelope;
  if (env && env.minGamma.length === hz.length && env.maxGamma.length === hz.length) {
    envelope = { best: series(env.minGamma, mode), worst: series(env.maxGamma, mode) };
  }

  const goalGamma = design ? goalMaxGamma(design.goal) : null;
  const goal = goalGamma === null ? null : plottedValue(goalGamma, mode);
  const band = design
    ? { start: design.band.startHz / unit.scale, stop: design.band.stopHz / unit.scale, centre: bandCenterHz(design.band) / unit.scale }
    : null;
  const bandwidth = result?.bandwidth ? { low: result.bandwidth.lowHz / unit.scale, high: result.bandwidth.highHz / unit.scale } : null;

  let yRange: [number, number];
  if (mode === 'return-loss') {
    let best = 0;
    for (const v of main) if (v !== null && v > best) best = v;
    for (const v of compare ?? []) if (v !== null && v > best) best = v;
    const top = Math.min(RETURN_LOSS_CEILING_DB, niceCeil(Math.max(best, (goal ?? 10) * 1.5, 10) + 2, 5));
    yRange = [0, top];
  } else {
    // room for the goal and for the worst in-band figure, up to the ceiling (beyond it the trace runs along the top)
    const worst = result && Number.isFinite(result.worstInBand.vswr) ? result.worstInBand.vswr : VSWR_CEILING;
    yRange = [1, Math.min(VSWR_CEILING, Math.max(3, niceCeil((goal ?? 2) * 1.75, 1), niceCeil(worst * 1.15, 1)))];
  }

  return {
    mode,
    unit,
    x,
    main,
    compare,
    compareLabel: input.compare?.label ?? null,
    envelope,
    goal,
    band,
    bandwidth,
    yRange,
    yLabel: mode === 'return-loss' ? 'Return loss (dB), higher is better' : 'VSWR, lower is better',
    yLabelShort: mode === 'return-loss' ? 'Return loss (dB)' : 'VSWR',
    xLabel: `Frequency (${unit.label})`,
  };
}

/** One sentence for assistive technology. */
export function plotSummary(model: PlotModel, result: AnalysisResult | null): string {
  if (!result || model.x.length === 0) return 'Sweep plot: no analysis yet.';
  const what = model.mode === 'return-loss' ? 'Return loss' : 'VSWR';
  const range = `${trim(model.x[0])} to ${trim(model.x[model.x.length - 1])} ${model.unit.label}`;
  const goal =
    model.goal === null ? '' : model.mode === 'return-loss' ? ` Goal: at least ${model.goal.toFixed(1)} dB.` : ` Goal: at most ${trim(model.goal)}.`;
  const w = result.worstInBand;
  const worst =
    model.mode === 'return-loss'
      ? ` Worst in band: ${Number.isFinite(w.returnLossDb) ? w.returnLossDb.toFixed(1) : '0'} dB.`
      : ` Worst in band: ${Number.isFinite(w.vswr) ? w.vswr.toFixed(2) : 'total reflection'}.`;
  const bw = model.bandwidth
    ? ` Meets the goal from ${trim(model.bandwidth.low)} to ${trim(model.bandwidth.high)} ${model.unit.label}.`
    : ' Misses the goal at the centre frequency.';
  return `${what} against frequency, ${range}.${goal}${worst}${bw}`;
}

function trim(v: number): string {
  return String(Number(v.toPrecision(4)));
}

/** Pixels per character of the axis labels (12 px Nunito Sans, generous), and the x axis and margins below. */
const LABEL_CHAR_PX = 6.5;
const Y_LABEL_MARGIN_PX = 60;

/** The long y label where the plot is tall enough to show it whole, else the short one (never a clipped label). */
export function yLabelFor(m: Pick<PlotModel, 'yLabel' | 'yLabelShort'>, plotHeight: number): string {
  return m.yLabel.length * LABEL_CHAR_PX + Y_LABEL_MARGIN_PX <= plotHeight ? m.yLabel : m.yLabelShort;
}
