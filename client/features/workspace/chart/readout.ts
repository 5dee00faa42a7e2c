/**
 * The chart's hover read-out and its spoken summary, as text. Never shows NaN: an open circuit reads
 * "open", a short "short", a total reflection "∞" for VSWR and "0 dB" for return loss.
 */
import { formatEngineering } from '../../../../shared/rf/units';
import { goalMaxGamma, type Design } from '../../../../shared/rf/design';
import type { AnalysisResult } from '../analysis/engine-types';
import { gammaAngleDeg, gammaMagnitude, gammaToZ } from './geometry';

export interface Readout {
  frequency: string | null;
  z: string;
  y: string;
  gamma: string;
  vswr: string;
  returnLoss: string;
}

/** |z| beyond this many z0 reads as an open, below 1/this as a short. */
const OPEN_RATIO = 1e9;

const PREFIXES: [number, string][] = [
  [1e-15, 'f'],
  [1e-12, 'p'],
  [1e-9, 'n'],
  [1e-6, 'µ'],
  [1e-3, 'm'],
  [1, ''],
  [1e3, 'k'],
  [1e6, 'M'],
  [1e9, 'G'],
  [1e12, 'T'],
];

/**
 * A complex value with one shared engineering prefix, 3–4 significant figures on the larger part:
 * "12.5 + j33.1 Ω", "10.0 − j10.0 mS".
 */
export function formatComplex(re: number, im: number, unit: string): string {
  const big = Math.max(Math.abs(re), Math.abs(im));
  let scale = 1;
  let prefix = '';
  if (big > 0) for (const [s, p] of PREFIXES) if (big >= s * 0.9995) [scale, prefix] = [s, p];
  const a = re / scale;
  const b = im / scale;
  const bigScaled = big / scale;
  const decimals = bigScaled >= 100 ? 1 : bigScaled >= 10 ? 2 : 3;
  const fix = (v: number) => {
    const s = Math.abs(v).toFixed(decimals);
    return s;
  };
  const reText = `${re < 0 && Number(fix(a)) !== 0 ? '−' : ''}${fix(a)}`;
  const sign = im < 0 && Number(fix(b)) !== 0 ? '−' : '+';
  return `${reText} ${sign} j${fix(b)} ${prefix}${unit}`;
}

export function impedanceText(z: readonly [number, number], z0: number): string {
  const m = Math.hypot(z[0], z[1]);
  if (!Number.isFinite(m) || m >= OPEN_RATIO * z0) return 'open';
  if (m <= z0 / OPEN_RATIO) return 'short';
  return formatComplex(z[0], z[1], 'Ω');
}

export function admittanceText(z: readonly [number, number], z0: number): string {
  const m = Math.hypot(z[0], z[1]);
  if (!Number.isFinite(m) || m >= OPEN_RATIO * z0) return '0 S (open)';
  if (m <= z0 / OPEN_RATIO) return 'short';
  const d = z[0] * z[0] + z[1] * z[1];
  return formatComplex(z[0] / d, -z[1] / d, 'S');
}

export function gammaText(g: readonly [number, number]): string {
  const m = gammaMagnitude(g);
  const angle = m < 5e-5 ? 0 : gammaAngleDeg(g);
  const a = angle.toFixed(1);
  return `${m.toFixed(3)} ∠ ${a.startsWith('-') && Number(a) !== 0 ? `−${a.slice(1)}` : a.replace(/^-/, '')}°`;
}

export function vswrText(gammaMag: number): string {
  if (!(gammaMag < 1 - 1e-9)) return '∞';
  const s = (1 + gammaMag) / (1 - gammaMag);
  return s >= 1000 ? formatEngineering(s, '', { digits: 3 }) : s.toFixed(s < 10 ? 2 : 1);
}

export function returnLossText(gammaMag: number): string {
  if (gammaMag >= 1) return '0 dB';
  if (gammaMag < 1e-6) return '> 120 dB';
  return `${(-20 * Math.log10(gammaMag)).toFixed(1)} dB`;
}

export function frequencyText(hz: number): string {
  return formatEngineering(hz, 'Hz', { digits: 4 });
}

/** The read-out for a point of the Γ plane (a hovered sweep point brings its frequency). */
export function chartReadout(gamma: readonly [number, number], z0: number, hz: number | null): Readout {
  const z = gammaToZ(gamma, z0);
  const m = gammaMagnitude(gamma);
  return {
    frequency: hz === null ? null : frequencyText(hz),
    z: impedanceText(z, z0),
    y: admittanceText(z, z0),
    gamma: gammaText(gamma),
    vswr: vswrText(m),
    returnLoss: returnLossText(m),
  };
}

/** One line for assistive technology: does the design meet its goal, over what bandwidth. */
export function chartSummary(design: Design | null, result: AnalysisResult | null): string {
  if (!design) return 'Smith chart: no design loaded.';
  const n = design.elements.length;
  const chain = n === 0 ? 'the load alone, with no matching elements' : `the load and ${n} matching element${n === 1 ? '' : 's'}`;
  if (!result) return `Smith chart of ${chain}; analysis pending.`;
  const goalG = goalMaxGamma(design.goal);
  const goal = 'maxVswr' in design.goal ? `VSWR ≤ ${design.goal.maxVswr}` : `return loss ≥ ${design.goal.minReturnLossDb} dB`;
  const worst = result.worstInBand;
  const finite = worst.vswr !== null && Number.isFinite(worst.vswr);
  const worstText = finite ? `VSWR ${worst.vswr.toFixed(2)}` : 'total reflection';
  const worstGamma = finite ? (worst.vswr - 1) / (worst.vswr + 1) : 1;
  const meets = worstGamma <= goalG + 1e-12;
  const bw = result.bandwidth
    ? `Bandwidth meeting the goal: ${frequencyText(result.bandwidth.lowHz)} to ${frequencyText(result.bandwidth.highHz)} (${(result.bandwidth.fractional * 100).toFixed(1)} %).`
    : 'The goal is not met at the centre frequency.';
  return `Smith chart of ${chain}. Worst in band: ${worstText}, ${meets ? 'meets' : 'misses'} the goal of ${goal}. ${bw}`;
}
