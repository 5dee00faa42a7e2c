/**
 * The figures panel's numbers as text: always with units and sensible precision, never NaN or
 * Infinity on screen ("no match", "total reflection", "—" instead).
 */
import { bandCenterHz, goalMaxGamma, type Complex, type Design } from '../../../../shared/rf/design';
import { reflectionFromImpedance } from '../../../../shared/rf/complex';
import { returnLossDbFromGamma, vswrFromGamma } from '../../../../shared/rf/figures';
import { formatEngineering } from '../../../../shared/rf/units';

const finite = (v: number | null | undefined): v is number => typeof v === 'number' && Number.isFinite(v);

/** "1.72" (VSWR, three figures), or "total reflection" where |Γ| ≥ 1 (no finite VSWR). */
export function vswrText(vswr: number | null | undefined): string {
  if (!finite(vswr)) return 'total reflection';
  return vswr >= 100 ? vswr.toFixed(0) : vswr.toPrecision(3);
}

/** "11.7 dB"; a perfect match (the engine's 300 dB floor) reads "> 60 dB". */
export function returnLossText(db: number | null | undefined): string {
  if (!finite(db)) return '—';
  if (db > 60) return '> 60 dB';
  return `${db.toFixed(1)} dB`;
}

/** |Γ| to three decimals ("0.263"), "< 0.001" for a near-perfect match. */
export function gammaText(g: number | null | undefined): string {
  if (!finite(g)) return '—';
  if (g < 0.001) return '< 0.001';
  return g.toFixed(3);
}

export function percentText(fraction: number | null | undefined, digits = 3): string {
  if (!finite(fraction)) return '—';
  const pct = fraction * 100;
  if (pct !== 0 && Math.abs(pct) < 0.01) return '< 0.01 %';
  return `${Number(pct.toPrecision(digits))} %`;
}

export function hzText(hz: number, digits = 4): string {
  return formatEngineering(hz, 'Hz', { digits });
}

/** "VSWR ≤ 2" or "return loss ≥ 10 dB". */
export function goalText(goal: Design['goal']): string {
  if ('maxVswr' in goal) return `VSWR ≤ ${Number(goal.maxVswr.toPrecision(4))}`;
  return `return loss ≥ ${Number(goal.minReturnLossDb.toPrecision(4))} dB`;
}

export interface MatchFigure {
  gamma: number;
  vswr: string;
  returnLoss: string;
  gammaText: string;
  meetsGoal: boolean;
}

/** The match at the band centre: from the impedance the port sees (the last stage of the impedance path). */
export function centreMatch(design: Design, stages: readonly { z: Complex }[]): MatchFigure | null {
  const last = stages[stages.length - 1];
  if (!last || !finite(last.z[0]) || !finite(last.z[1])) return null;
  const zs = design.port?.impedance ?? ([design.referenceOhms, 0] as Complex);
  const [gr, gi] = reflectionFromImpedance(last.z, zs);
  const gamma = Math.hypot(gr, gi);
  if (!finite(gamma)) return null;
  return {
    gamma,
    gammaText: gammaText(gamma),
    vswr: vswrText(vswrFromGamma(gamma)),
    returnLoss: returnLossText(returnLossDbFromGamma(gamma)),
    meetsGoal: gamma <= goalMaxGamma(design.goal),
  };
}

export interface BandwidthFigure {
  /** "2.391–2.512 GHz" */
  range: string;
  /** "121 MHz" */
  width: string;
  /** "4.96 %" */
  fractional: string;
  /** whether it covers the whole band */
  coversBand: boolean;
}

export function bandwidthFigure(
  design: Design,
  bandwidth: { lowHz: number; highHz: number; fractional: number } | null,
): BandwidthFigure | null {
  if (!bandwidth || !finite(bandwidth.lowHz) || !finite(bandwidth.highHz)) return null;
  const { lowHz, highHz } = bandwidth;
  return {
    range: frequencyRangeText(lowHz, highHz),
    width: hzText(highHz - lowHz, 3),
    fractional: percentText(bandwidth.fractional),
    coversBand: lowHz <= design.band.startHz && highHz >= design.band.stopHz,
  };
}

/** "2.4–2.4835 GHz", or "900 MHz–1.1 GHz" when the prefixes differ. */
export function frequencyRangeText(lowHz: number, highHz: number, digits = 5): string {
  const a = hzText(lowHz, digits);
  const b = hzText(highHz, digits);
  const [na, ua] = a.split(' ');
  const [nb, ub] = b.split(' ');
  return ua !== undefined && ua === ub ? `${na}–${nb} ${ua}` : `${a}–${b}`;
}

/** The design's band as the goal's reference: what the bandwidth figure is compared against. */
export function bandFractional(design: Design): number {
  return (design.band.stopHz - design.band.startHz) / bandCenterHz(design.band);
}

export interface LimitGaugeFigure {
  /** the design's share of the bound, 0..1 for the bar (clamped) */
  fill: number;
  /** "27 %" */
  ratio: string;
  bound: string;
  design: string;
  model: string;
}

const MODEL_WORDS: Record<string, string> = {
  'parallel-rc': 'parallel RC',
  'series-rc': 'series RC',
  'parallel-rl': 'parallel RL',
  'series-rl': 'series RL',
};

export function limitGaugeFigure(
  limit: { model: string; maxFractional: number; ratio: number } | null,
  bandwidth: { fractional: number } | null,
): LimitGaugeFigure | null {
  if (!limit || !finite(limit.maxFractional)) return null;
  const ratio = bandwidth && finite(limit.ratio) ? limit.ratio : 0;
  return {
    fill: Math.max(0, Math.min(1, ratio)),
    ratio: bandwidth ? percentText(ratio, 2) : '—',
    bound: percentText(limit.maxFractional),
    design: bandwidth ? percentText(bandwidth.fractional) : 'no match',
    model: MODEL_WORDS[limit.model] ?? limit.model,
  };
}

/** Peak voltage and current with units: "31.6 V", "632 mA". */
export function stressText(s: { voltagePeak: number; currentPeak: number }): { voltage: string; current: string } {
  return {
    voltage: finite(s.voltagePeak) ? formatEngineering(s.voltagePeak, 'V', { digits: 3 }) : '—',
    current: finite(s.currentPeak) ? formatEngineering(s.currentPeak, 'A', { digits: 3 }) : '—',
  };
}

export function powerText(w: number): string {
  return formatEngineering(w, 'W', { digits: 3 });
}
