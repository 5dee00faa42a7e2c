/**
 * Band figures (CONTRACT §3):
 * - bandwidth: the widest contiguous stretch of the sweep that contains the band centre and meets
 *   the goal (|Γ| ≤ |Γ|max). Walking outward from the centre (evaluated exactly there), the first
 *   sweep point that fails ends the stretch; the crossing lies between it and its passing
 *   neighbour, by linear interpolation of |Γ| against frequency. A side with no failing point ends
 *   at the last sweep point (or at the centre when the sweep does not reach past it). `null` where
 *   the centre itself fails. fractional = (high − low)/centre.
 * - worstInBand: the largest |Γ| over the sweep points inside the band plus both band edges.
 */
import { returnLossDbFromGamma, vswrFromGamma } from './figures';

export interface Bandwidth {
  lowHz: number;
  highHz: number;
  fractional: number;
}

export interface WorstInBand {
  gammaMagnitude: number;
  /** Infinity where |Γ| ≥ 1 (JSON null). */
  vswr: number;
  returnLossDb: number;
}

/** f where |Γ| crosses `max` between a failing point (f1, g1 > max) and a passing one (f2, g2 ≤ max). */
function crossing(f1: number, g1: number, f2: number, g2: number, max: number): number {
  const t = (max - g2) / (g1 - g2);
  return f2 + t * (f1 - f2);
}

export function bandwidthAround(
  freqs: Float64Array,
  gammaMag: Float64Array,
  centerHz: number,
  centerGamma: number,
  maxGamma: number,
): Bandwidth | null {
  if (!(centerGamma <= maxGamma)) return null;
  const n = freqs.length;
  let idx = 0; // first sweep point above the centre
  while (idx < n && freqs[idx] <= centerHz) idx++;

  let innerF = centerHz;
  let innerG = centerGamma;
  let lowHz = NaN;
  for (let k = idx - 1; k >= 0; k--) {
    const g = gammaMag[k];
    if (g > maxGamma) {
      lowHz = crossing(freqs[k], g, innerF, innerG, maxGamma);
      break;
    }
    innerF = freqs[k];
    innerG = g;
  }
  if (Number.isNaN(lowHz)) lowHz = innerF;

  innerF = centerHz;
  innerG = centerGamma;
  let highHz = NaN;
  for (let k = idx; k < n; k++) {
    const g = gammaMag[k];
    if (g > maxGamma) {
      highHz = crossing(freqs[k], g, innerF, innerG, maxGamma);
      break;
    }
    innerF = freqs[k];
    innerG = g;
  }
  if (Number.isNaN(highHz)) highHz = innerF;
  return { lowHz, highHz, fractional: (highHz - lowHz) / centerHz };
}

/** Worst |Γ| over the sweep points inside [startHz, stopHz] and the two edge values given. */
export function worstInBand(
  freqs: Float64Array,
  gammaMag: Float64Array,
  startHz: number,
  stopHz: number,
  edgeGammas: readonly number[],
): WorstInBand {
  let m = 0;
  for (const g of edgeGammas) if (g > m) m = g;
  for (let i = 0; i < freqs.length; i++) {
    const f = freqs[i];
    if (f >= startHz && f <= stopHz && gammaMag[i] > m) m = gammaMag[i];
  }
  return { gammaMagnitude: m, vswr: vswrFromGamma(m), returnLossDb: returnLossDbFromGamma(m) };
}
