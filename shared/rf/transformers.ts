/**
 * Quarter-wave, binomial and Chebyshev multi-section transformers between two real impedances, and
 * the line section that first turns a complex load real.
 *
 * Sections are listed from the source side (impedance `zSource`) towards the load, as in Pozar,
 * Microwave Engineering, §5.5–5.8 (from memory); the finder reverses them into chain order. Each
 * section is a quarter wave long at the design frequency. The multi-section designs use the small-
 * reflection theory in its logarithmic form, ln(Z_{n+1}/Z_n) = 2Γ_n, so the impedances step exactly
 * from `zSource` to `zLoad` and, being symmetric in ln Z, match perfectly at the design frequency.
 */

/** Impedance of a single quarter-wave section between real `zSource` and `zLoad`: √(Z_s Z_L). */
export function quarterWaveImpedance(zSource: number, zLoad: number): number {
  return Math.sqrt(zSource * zLoad);
}

/**
 * Fractional bandwidth within which a single quarter-wave section keeps |Γ| ≤ gammaMax (Pozar eq. for
 * the quarter-wave transformer bandwidth, §5.4, from memory):
 * Δf/f0 = 2 − (4/π)·acos[ Γm/√(1 − Γm²) · 2√(Z0 Z_L)/|Z_L − Z0| ]. `Infinity` when |Γ| never exceeds Γm.
 */
export function quarterWaveFractionalBandwidth(zSource: number, zLoad: number, gammaMax: number): number {
  const arg = (gammaMax / Math.sqrt(1 - gammaMax * gammaMax)) * ((2 * Math.sqrt(zSource * zLoad)) / Math.abs(zLoad - zSource));
  if (!(arg < 1)) return Infinity;
  return 2 - (4 / Math.PI) * Math.acos(arg);
}

function binomialCoefficient(n: number, k: number): number {
  let c = 1;
  for (let i = 1; i <= k; i++) c = (c * (n - k + i)) / i;
  return c;
}

/** Section impedances Z_1..Z_N from the source side, given reflection coefficients Γ_0..Γ_N (ln form). */
function impedancesFromReflections(zSource: number, gammas: readonly number[]): number[] {
  const out: number[] = [];
  let lnZ = Math.log(zSource);
  for (let n = 0; n < gammas.length - 1; n++) {
    lnZ += 2 * gammas[n];
    out.push(Math.exp(lnZ));
  }
  return out;
}

/**
 * Binomial (maximally flat) transformer of `n` sections: Γ_k = A·C(N, k), A = 2^−(N+1) ln(Z_L/Z_s)
 * (Pozar §5.6, from memory). Returns Z_1..Z_N from the source side.
 */
export function binomialSectionImpedances(zSource: number, zLoad: number, n: number): number[] {
  const a = Math.pow(2, -(n + 1)) * Math.log(zLoad / zSource);
  const gammas = Array.from({ length: n + 1 }, (_, k) => a * binomialCoefficient(n, k));
  return impedancesFromReflections(zSource, gammas);
}

/**
 * Fractional bandwidth of an N-section binomial transformer at |Γ| ≤ gammaMax:
 * Δf/f0 = 2 − (4/π)·acos[½ (Γm/|A|)^(1/N)], with A = 2^−(N+1) ln(Z_L/Z_s) (Pozar §5.6, from memory).
 */
export function binomialFractionalBandwidth(zSource: number, zLoad: number, n: number, gammaMax: number): number {
  const a = Math.abs(Math.pow(2, -(n + 1)) * Math.log(zLoad / zSource));
  const arg = 0.5 * Math.pow(gammaMax / a, 1 / n);
  if (!(arg < 1)) return Infinity;
  return 2 - (4 / Math.PI) * Math.acos(arg);
}

/** Chebyshev polynomial T_n(x) for any real x. */
export function chebyshevT(n: number, x: number): number {
  if (Math.abs(x) <= 1) return Math.cos(n * Math.acos(x));
  const s = x > 0 || n % 2 === 0 ? 1 : -1;
  return s * Math.cosh(n * Math.acosh(Math.abs(x)));
}

/**
 * sec θm of an N-section Chebyshev transformer with passband ripple `ripple`:
 * sec θm = cosh[(1/N)·acosh(|ln(Z_L/Z_s)|/(2Γm))] (Pozar eq. 5.64 form, from memory).
 * `null` when the ends are already within the ripple (no transformer is needed at that ripple).
 */
export function chebyshevSecThetaM(zSource: number, zLoad: number, n: number, ripple: number): number | null {
  const r = Math.abs(Math.log(zLoad / zSource)) / (2 * ripple);
  if (!(r > 1)) return null;
  return Math.cosh(Math.acosh(r) / n);
}

/**
 * Chebyshev (equal-ripple) transformer of `n` sections: Γ(θ) = A e^(−jNθ) T_N(sec θm cos θ) with A = ±Γm,
 * expanded into 2[Γ_0 cos Nθ + Γ_1 cos(N−2)θ + …] (Pozar §5.8, from memory). The cosine coefficients are
 * taken exactly by a discrete Fourier sum over 4N + 4 points. Returns Z_1..Z_N from the source side,
 * or `null` when the ripple is too large for the ratio.
 */
export function chebyshevSectionImpedances(zSource: number, zLoad: number, n: number, ripple: number): number[] | null {
  const sec = chebyshevSecThetaM(zSource, zLoad, n, ripple);
  if (sec === null) return null;
  const a = Math.sign(Math.log(zLoad / zSource)) * ripple;
  const m = 4 * n + 4;
  const samples = Array.from({ length: m }, (_, j) => a * chebyshevT(n, sec * Math.cos((2 * Math.PI * j) / m)));
  const cosCoefficient = (k: number) => {
    let s = 0;
    for (let j = 0; j < m; j++) s += samples[j] * Math.cos((2 * Math.PI * j * k) / m);
    return (k === 0 ? 1 : 2) * (s / m);
  };
  const gammas: number[] = [];
  for (let i = 0; i <= n; i++) {
    const k = Math.abs(n - 2 * i);
    gammas.push(k === 0 ? cosCoefficient(0) : cosCoefficient(k) / 2);
  }
  return impedancesFromReflections(zSource, gammas);
}

/**
 * Fractional bandwidth of an N-section Chebyshev transformer at |Γ| ≤ gammaMax. At the ripple itself it
 * is 2 − 4θm/π (Pozar §5.8, from memory); at a larger goal the edge moves to where
 * Γm·T_N(sec θm cos θ) = gammaMax, i.e. cos θ = cosh[acosh(gammaMax/Γm)/N]/sec θm.
 */
export function chebyshevFractionalBandwidth(zSource: number, zLoad: number, n: number, ripple: number, gammaMax: number): number | null {
  const sec = chebyshevSecThetaM(zSource, zLoad, n, ripple);
  if (sec === null) return null;
  if (gammaMax < ripple) return null;
  const c = Math.cosh(Math.acosh(gammaMax / ripple) / n) / sec;
  if (!(c < 1)) return Infinity;
  return 2 - (4 / Math.PI) * Math.acos(c);
}

export interface RealizingLine {
  /** Length in degrees (in [0, 180)) of a line of impedance `lineZ0` after which the load is real. */
  readonly degrees: number;
  /** The real impedance seen after it. */
  readonly resistance: number;
  readonly kind: 'maximum' | 'minimum';
}

/**
 * The two line lengths after which a complex load looks real: Γ(d) = Γ_L e^(−j2βd) is real positive
 * (resistance maximum, Z0(1+|Γ|)/(1−|Γ|)) at βd = φ/2 and real negative (minimum) a quarter wave
 * further (common practice). Empty for a real load or one that reflects everything.
 */
export function realizingLines(zLoad: readonly [number, number], lineZ0: number): RealizingLine[] {
  const [r, x] = zLoad;
  const dr = r + lineZ0;
  const m = dr * dr + x * x;
  const gr = ((r - lineZ0) * dr + x * x) / m;
  const gi = (x * dr - (r - lineZ0) * x) / m;
  const mag = Math.hypot(gr, gi);
  if (!(mag < 1) || Math.abs(x) <= 1e-12 * Math.max(r, lineZ0)) return [];
  const phi = (Math.atan2(gi, gr) * 180) / Math.PI;
  const norm = (d: number) => ((d % 180) + 180) % 180;
  return [
    { degrees: norm(phi / 2), resistance: (lineZ0 * (1 + mag)) / (1 - mag), kind: 'maximum' as const },
    { degrees: norm(phi / 2 + 90), resistance: (lineZ0 * (1 - mag)) / (1 + mag), kind: 'minimum' as const },
  ].sort((p, q) => p.degrees - q.degrees);
}
