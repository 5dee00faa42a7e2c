/**
 * Reflection figures from |Γ| (CONTRACT §1), with the engine's conventions for the edges:
 * - VSWR = (1 + |Γ|)/(1 − |Γ|); Infinity where |Γ| ≥ 1 (JSON null).
 * - Return loss dB = −20·log10|Γ|, with |Γ| floored at RETURN_LOSS_FLOOR_GAMMA, so a perfect
 *   match reads 300 dB instead of an infinite value (negative where |Γ| > 1, e.g. noisy active data).
 * - Mismatch loss dB = −10·log10(1 − |Γ|²); Infinity where |Γ| ≥ 1 (JSON null).
 * Sources: Pozar, Microwave Engineering 4th ed., §2.3 (eqs. 2.41, 2.53) for VSWR and return loss;
 * mismatch loss is common practice.
 */

/** |Γ| below this is rounding noise: return loss is capped at 300 dB. */
export const RETURN_LOSS_FLOOR_GAMMA = 1e-15;

export function vswrFromGamma(m: number): number {
  return m >= 1 ? Infinity : (1 + m) / (1 - m);
}

export function returnLossDbFromGamma(m: number): number {
  return -20 * Math.log10(m > RETURN_LOSS_FLOOR_GAMMA ? m : RETURN_LOSS_FLOOR_GAMMA);
}

export function mismatchLossDbFromGamma(m: number): number {
  return m >= 1 ? Infinity : -10 * Math.log10(1 - m * m);
}

/** |Γ| from a VSWR (s ≥ 1). */
export function gammaFromVswr(s: number): number {
  return (s - 1) / (s + 1);
}
