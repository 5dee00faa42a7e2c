/**
 * Scalar complex helpers for the code outside the hot loops (single-frequency figures, the
 * impedance path, the stress figures). A complex number is a `[re, im]` tuple, as in the design
 * file. The sweep loops in `cascade.ts` and `analyze.ts` inline the same arithmetic on plain
 * numbers instead, so that they allocate nothing per point.
 */
import type { Complex } from './design';

export const complexFrom = (re: number, im = 0): Complex => [re, im];
export const complexAdd = (a: Complex, b: Complex): Complex => [a[0] + b[0], a[1] + b[1]];
export const complexSub = (a: Complex, b: Complex): Complex => [a[0] - b[0], a[1] - b[1]];
export const complexMul = (a: Complex, b: Complex): Complex => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
export const complexScale = (a: Complex, k: number): Complex => [a[0] * k, a[1] * k];
export const complexConj = (a: Complex): Complex => [a[0], -a[1]];
export const complexAbs = (a: Complex): number => Math.hypot(a[0], a[1]);

/**
 * a / b by Smith's method (no overflow for large operands). Division by exactly zero gives
 * a very large finite number in the direction of `a` (see `IMPEDANCE_OPEN_OHMS`), never NaN.
 */
export function complexDiv(a: Complex, b: Complex): Complex {
  const [ar, ai] = a;
  const [br, bi] = b;
  if (br === 0 && bi === 0) {
    const m = Math.hypot(ar, ai);
    return m === 0 ? [0, 0] : [(ar / m) * IMPEDANCE_OPEN_OHMS, (ai / m) * IMPEDANCE_OPEN_OHMS];
  }
  if (Math.abs(br) >= Math.abs(bi)) {
    const r = bi / br;
    const d = br + bi * r;
    return [(ar + ai * r) / d, (ai - ar * r) / d];
  }
  const r = br / bi;
  const d = br * r + bi;
  return [(ar * r + ai) / d, (ai * r - ar) / d];
}

export const complexInv = (a: Complex): Complex => complexDiv([1, 0], a);

/** cosh and sinh of (a + jb). */
export function complexCoshSinh(a: number, b: number): { cosh: Complex; sinh: Complex } {
  const ch = Math.cosh(a);
  const sh = Math.sinh(a);
  const c = Math.cos(b);
  const s = Math.sin(b);
  return { cosh: [ch * c, sh * s], sinh: [sh * c, ch * s] };
}

/**
 * The largest impedance magnitude the engine reports (ohms). An open circuit (or a
 * division by an exact zero) is reported as an impedance of this magnitude, so that every
 * impedance in a result is finite. Reflection coefficients are computed without it and stay exact.
 */
export const IMPEDANCE_OPEN_OHMS = 1e15;

/** Clamp |z| to IMPEDANCE_OPEN_OHMS keeping its direction; NaN parts become an open circuit on the real axis. */
export function impedanceClamp(z: Complex): Complex {
  const [re, im] = z;
  if (!Number.isFinite(re) || !Number.isFinite(im)) {
    if (Number.isNaN(re) || Number.isNaN(im)) return [IMPEDANCE_OPEN_OHMS, 0];
    const sr = Number.isFinite(re) ? 0 : Math.sign(re);
    const si = Number.isFinite(im) ? 0 : Math.sign(im);
    const m = Math.hypot(sr, si);
    return [(sr / m) * IMPEDANCE_OPEN_OHMS, (si / m) * IMPEDANCE_OPEN_OHMS];
  }
  const m = Math.hypot(re, im);
  if (m <= IMPEDANCE_OPEN_OHMS) return [re, im];
  return [(re / m) * IMPEDANCE_OPEN_OHMS, (im / m) * IMPEDANCE_OPEN_OHMS];
}

/** Power-wave reflection Γ = (Z − Zs*)/(Z + Zs) for a scalar impedance. */
export function reflectionFromImpedance(z: Complex, zs: Complex): Complex {
  return complexDiv([z[0] - zs[0], z[1] + zs[1]], [z[0] + zs[0], z[1] + zs[1]]);
}
