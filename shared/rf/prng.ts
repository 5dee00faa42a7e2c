/**
 * Seeded pseudo-random numbers for the yield run and refine's random restarts: mulberry32 (a 32-bit
 * generator by Tommy Ettinger, public domain; common practice in JavaScript), with a state the
 * caller owns, so the same seed gives the same stream on every platform.
 */

export interface Prng {
  state: number;
  /** A spare normal deviate from the last Box–Muller pair, or NaN. */
  spare: number;
}

/** A generator seeded with any finite number (its 32-bit integer part). */
export function prngFrom(seed: number): Prng {
  return { state: (Math.trunc(seed) | 0) >>> 0, spare: Number.NaN };
}

/** The next 32-bit unsigned integer. */
export function prngNextUint32(p: Prng): number {
  p.state = (p.state + 0x6d2b79f5) >>> 0;
  let t = p.state;
  t = Math.imul(t ^ (t >>> 15), t | 1);
  t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
  return (t ^ (t >>> 14)) >>> 0;
}

/** Uniform in [0, 1). */
export function prngUniform(p: Prng): number {
  return prngNextUint32(p) / 4294967296;
}

/** Uniform in [−1, 1). */
export function prngSigned(p: Prng): number {
  return 2 * prngUniform(p) - 1;
}

/** Standard normal deviate (Box–Muller, common practice). */
export function prngNormal(p: Prng): number {
  if (!Number.isNaN(p.spare)) {
    const s = p.spare;
    p.spare = Number.NaN;
    return s;
  }
  let u = prngUniform(p);
  while (u === 0) u = prngUniform(p);
  const v = prngUniform(p);
  const r = Math.sqrt(-2 * Math.log(u));
  p.spare = r * Math.sin(2 * Math.PI * v);
  return r * Math.cos(2 * Math.PI * v);
}

/** An independent stream derived from a seed and a stream number (for per-element sensitivity runs). */
export function prngSplit(seed: number, stream: number): Prng {
  const p = prngFrom(seed ^ Math.imul(stream + 1, 0x9e3779b9));
  prngNextUint32(p);
  return p;
}
