/**
 * The Bode–Fano limit (the limit gauge). For a load that is, or behaves at the band centre like,
 * an R with a reactive part, no lossless matching network can keep |Γ| ≤ Γm over more than
 *
 *     Δω/ω0 ≤ π / (Q·ln(1/Γm))
 *
 * with a rectangular reflection response. Sources: Fano (1950); Pozar, Microwave Engineering
 * 4th ed., §5.9 (the four load types and their integrals; recalled from memory):
 * - parallel RC: ∫ ln(1/|Γ|) dω ≤ π/(RC),          Q = ω0·R·C
 * - series RC:   ∫ ω⁻² ln(1/|Γ|) dω ≤ π·R·C,       Q = 1/(ω0·R·C)
 * - parallel RL: ∫ ω⁻² ln(1/|Γ|) dω ≤ π·L/R,       Q = R/(ω0·L)
 * - series RL:   ∫ ln(1/|Γ|) dω ≤ π·R/L,           Q = ω0·L/R
 * The ω⁻² forms give Δω/(ω1·ω2) ≤ ...; taking ω1·ω2 ≈ ω0² gives the same expression.
 *
 * Which model and Q (the fit):
 * - rlc loads use their own parts. A series R with L and C obeys both series integrals (the RL
 *   and the RC one); the tighter (larger Q) is reported. Likewise a parallel R with L and C. A
 *   load with no reactive part, or a series R of 0 (it absorbs nothing), has no limit (null).
 * - impedance, measured and table loads are fitted at the centre: Z(ω0) = R + jX, Q = |X|/R (the
 *   same for the series and the parallel reading at one frequency). X < 0 is an RC, X > 0 an RL.
 *   Series or parallel is chosen by the load's dispersion: Z is evaluated at ω0(1 ± δ) (δ the
 *   band's half width, at least 0.1 %) and the model predicting those two points better wins; a
 *   constant impedance is read as series. R ≤ 0, or Q below 1e-9, has no limit (null).
 * `ratio` = design bandwidth.fractional / maxFractional; 0 where the goal fails at the centre.
 */
import { type Design } from './design';
import { loadImpedances } from './loads';

export type LimitModel = 'parallel-rc' | 'series-rc' | 'parallel-rl' | 'series-rl';

export interface LoadQFit {
  model: LimitModel;
  q: number;
}

export interface Limit {
  model: LimitModel;
  maxFractional: number;
  ratio: number;
}

const Q_MIN = 1e-9;

/** Bode–Fano bound on the fractional bandwidth for a load of quality factor q and a goal |Γ|max. */
export function bodeFanoMaxFractional(q: number, maxGamma: number): number {
  return Math.PI / (q * Math.log(1 / maxGamma));
}

function tighter(a: LoadQFit | null, b: LoadQFit | null): LoadQFit | null {
  if (!a) return b;
  if (!b) return a;
  return b.q > a.q ? b : a;
}

/** The reactive model of the load at the band centre (see the module comment), or null. */
export function loadQFit(design: Design, centerHz: number): LoadQFit | null {
  const load = design.load;
  const w0 = 2 * Math.PI * centerHz;
  let fit: LoadQFit | null = null;
  if (load.kind === 'rlc') {
    const { r, l, c } = load;
    if (load.topology === 'series') {
      if (!(r > 0)) return null;
      if (l !== undefined) fit = tighter(fit, { model: 'series-rl', q: (w0 * l) / r });
      if (c !== undefined) fit = tighter(fit, { model: 'series-rc', q: 1 / (w0 * r * c) });
    } else {
      if (c !== undefined) fit = tighter(fit, { model: 'parallel-rc', q: w0 * r * c });
      if (l !== undefined) fit = tighter(fit, { model: 'parallel-rl', q: r / (w0 * l) });
    }
    return fit && Number.isFinite(fit.q) && fit.q >= Q_MIN ? fit : null;
  }

  const z = loadImpedances(load, design.referenceOhms, Float64Array.of(centerHz));
  const [rr, x] = [z[0], z[1]];
  if (!(rr > 0) || x === 0) return null;
  const q = Math.abs(x) / rr;
  if (!(q >= Q_MIN) || !Number.isFinite(q)) return null;
  const capacitive = x < 0;
  let parallel = false;
  if (load.kind !== 'impedance') parallel = parallelFitsBetter(design, centerHz, rr, x);
  const model: LimitModel = capacitive ? (parallel ? 'parallel-rc' : 'series-rc') : parallel ? 'parallel-rl' : 'series-rl';
  return { model, q };
}

/** True when a parallel R‖X model predicts the load at ω0(1 ± δ) better than a series R + X model. */
function parallelFitsBetter(design: Design, centerHz: number, r0: number, x0: number): boolean {
  const half = (design.band.stopHz - design.band.startHz) / 2 / centerHz;
  const delta = Math.max(half, 1e-3);
  const fs = Float64Array.of(centerHz * (1 - delta), centerHz * (1 + delta));
  let z: Float64Array;
  try {
    z = loadImpedances(design.load, design.referenceOhms, fs);
  } catch {
    return false; // no data either side of the centre: read as series
  }
  // Admittance at the centre.
  const d0 = r0 * r0 + x0 * x0;
  const g0 = r0 / d0;
  const b0 = -x0 / d0;
  const capacitive = x0 < 0;
  let errSeries = 0;
  let errParallel = 0;
  for (let k = 0; k < 2; k++) {
    const s = fs[k] / centerHz; // ω/ω0
    const zr = z[2 * k];
    const zi = z[2 * k + 1];
    // Series: R constant, X ∝ 1/ω (RC) or ∝ ω (RL).
    const xs = capacitive ? x0 / s : x0 * s;
    errSeries += ((zr - r0) ** 2 + (zi - xs) ** 2) / d0;
    // Parallel: G constant, B ∝ ω (RC) or ∝ 1/ω (RL); back to Z.
    const bp = capacitive ? b0 * s : b0 / s;
    const dp = g0 * g0 + bp * bp;
    errParallel += ((zr - g0 / dp) ** 2 + (zi + bp / dp) ** 2) / d0;
  }
  return errParallel < errSeries;
}

/** The limit gauge's figures, or null where no model applies. */
export function bodeFanoLimit(design: Design, centerHz: number, maxGamma: number, fractional: number | null): Limit | null {
  const fit = loadQFit(design, centerHz);
  if (!fit) return null;
  const maxFractional = bodeFanoMaxFractional(fit.q, maxGamma);
  if (!Number.isFinite(maxFractional) || !(maxFractional > 0)) return null;
  return { model: fit.model, maxFractional, ratio: fractional === null ? 0 : fractional / maxFractional };
}
