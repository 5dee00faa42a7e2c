/**
 * Two-port conversions between S-parameters and the ABCD (chain) matrix, for a real reference
 * impedance z0 on both ports. Source: Pozar, Microwave Engineering 4th ed., Table 4.2.
 *
 * Layout: an ABCD matrix at one frequency is 8 doubles `[Ar, Ai, Br, Bi, Cr, Ci, Dr, Di]`; an
 * S-matrix is 8 doubles `[S11r, S11i, S12r, S12i, S21r, S21i, S22r, S22i]` (row-major, as
 * Touchstone data). Both are read and written at an `offset` into a Float64Array so a whole
 * sweep can live in one array (8 doubles per point).
 */

/** 1/(re + j·im) into `out[0..1]`. */
function inv(re: number, im: number, out: Float64Array): void {
  const d = re * re + im * im;
  out[0] = re / d;
  out[1] = -im / d;
}
const scratch = new Float64Array(2);

/**
 * S -> ABCD (Pozar Table 4.2):
 * A = ((1+S11)(1−S22) + S12S21)/(2S21), B = z0((1+S11)(1+S22) − S12S21)/(2S21),
 * C = ((1−S11)(1−S22) − S12S21)/(2S21 z0), D = ((1−S11)(1+S22) + S12S21)/(2S21).
 * Returns false (and writes nothing) when S21 = 0, where no chain matrix exists.
 */
export function abcdFromS(s: ArrayLike<number>, so: number, z0: number, out: Float64Array, oo: number): boolean {
  const s11r = s[so], s11i = s[so + 1], s12r = s[so + 2], s12i = s[so + 3];
  const s21r = s[so + 4], s21i = s[so + 5], s22r = s[so + 6], s22i = s[so + 7];
  if (s21r === 0 && s21i === 0) return false;
  const pr = s12r * s21r - s12i * s21i; // S12·S21
  const pi = s12r * s21i + s12i * s21r;
  inv(2 * s21r, 2 * s21i, scratch);
  const kr = scratch[0], ki = scratch[1]; // 1/(2 S21)
  // (1+S11)(1−S22)
  const a1r = (1 + s11r) * (1 - s22r) + s11i * s22i;
  const a1i = s11i * (1 - s22r) - (1 + s11r) * s22i;
  // (1+S11)(1+S22)
  const b1r = (1 + s11r) * (1 + s22r) - s11i * s22i;
  const b1i = s11i * (1 + s22r) + (1 + s11r) * s22i;
  // (1−S11)(1−S22)
  const c1r = (1 - s11r) * (1 - s22r) - s11i * s22i;
  const c1i = -s11i * (1 - s22r) - (1 - s11r) * s22i;
  // (1−S11)(1+S22)
  const d1r = (1 - s11r) * (1 + s22r) + s11i * s22i;
  const d1i = -s11i * (1 + s22r) + (1 - s11r) * s22i;
  const mul = (xr: number, xi: number, scale: number, at: number) => {
    out[at] = (xr * kr - xi * ki) * scale;
    out[at + 1] = (xr * ki + xi * kr) * scale;
  };
  mul(a1r + pr, a1i + pi, 1, oo);
  mul(b1r - pr, b1i - pi, z0, oo + 2);
  mul(c1r - pr, c1i - pi, 1 / z0, oo + 4);
  mul(d1r + pr, d1i + pi, 1, oo + 6);
  return true;
}

/**
 * ABCD -> S (Pozar Table 4.2), with Δ = A + B/z0 + C·z0 + D:
 * S11 = (A + B/z0 − C z0 − D)/Δ, S12 = 2(AD − BC)/Δ, S21 = 2/Δ, S22 = (−A + B/z0 − C z0 + D)/Δ.
 */
export function sFromAbcd(t: ArrayLike<number>, to: number, z0: number, out: Float64Array, oo: number): void {
  const ar = t[to], ai = t[to + 1], br = t[to + 2] / z0, bi = t[to + 3] / z0;
  const cr = t[to + 4] * z0, ci = t[to + 5] * z0, dr = t[to + 6], di = t[to + 7];
  const detr = t[to] * t[to + 6] - t[to + 1] * t[to + 7] - (t[to + 2] * t[to + 4] - t[to + 3] * t[to + 5]);
  const deti = t[to] * t[to + 7] + t[to + 1] * t[to + 6] - (t[to + 2] * t[to + 5] + t[to + 3] * t[to + 4]);
  const er = ar + br + cr + dr, ei = ai + bi + ci + di;
  smithDiv(ar + br - cr - dr, ai + bi - ci - di, er, ei, out, oo);
  smithDiv(2 * detr, 2 * deti, er, ei, out, oo + 2);
  smithDiv(2, 0, er, ei, out, oo + 4);
  smithDiv(-ar + br - cr + dr, -ai + bi - ci + di, er, ei, out, oo + 6);
}

/** (ar + j ai)/(br + j bi) into out[o], out[o+1] by Smith's method (safe for large operands). */
export function smithDiv(ar: number, ai: number, br: number, bi: number, out: Float64Array, o: number): void {
  if (Math.abs(br) >= Math.abs(bi)) {
    const r = bi / br;
    const d = br + bi * r;
    out[o] = (ar + ai * r) / d;
    out[o + 1] = (ai - ar * r) / d;
  } else {
    const r = br / bi;
    const d = br * r + bi;
    out[o] = (ar * r + ai) / d;
    out[o + 1] = (ai * r - ar) / d;
  }
}

/** Swap the two ports of an S-matrix in place (S11 <-> S22, S12 <-> S21). */
export function sFlip(s: Float64Array, o: number): void {
  let t = s[o];
  s[o] = s[o + 6];
  s[o + 6] = t;
  t = s[o + 1];
  s[o + 1] = s[o + 7];
  s[o + 7] = t;
  t = s[o + 2];
  s[o + 2] = s[o + 4];
  s[o + 4] = t;
  t = s[o + 3];
  s[o + 3] = s[o + 5];
  s[o + 5] = t;
}
