/**
 * The fast path: input impedance of a chain over a frequency grid, for refine, yield and the
 * match finder, which call it thousands of times. Frequency-outer loop over a compiled plan
 * (elements.ts); scalar complex arithmetic on locals; nothing allocated per point.
 *
 * The state at each point is the pair (N, D) with Z = N/D, i.e. the load-side voltage and
 * current up to a common factor. Each element maps (N, D) linearly (series: N += Z·D; shunt:
 * D += Y·N; line: the ABCD matrix), so no step divides and an open, a short or a resonance
 * is exact until the one division at the end. The pair is rescaled when it grows past 1e150
 * (or falls below 1e-150). The final Zin is clamped to IMPEDANCE_OPEN_OHMS (complex.ts).
 */
import { IMPEDANCE_OPEN_OHMS } from './complex';
import { type Complex, type Design, type Element } from './design';
import { chainPlan, type ChainPlan } from './elements';
import { sweepFrequencies } from './frequency';
import { loadImpedances } from './loads';

export { bandFrequencies } from './frequency';

const TWO_PI = 2 * Math.PI;
// Kind codes of elements.ts, repeated here on purpose: an imported binding read inside the hot
// switch costs a property load per case once the module is compiled to CommonJS (tsx, Vitest),
// which made the loop ten times slower. tests/rf/kind-codes.test.ts keeps the copies equal.
const K_SERIES_L = 1;
const K_SERIES_C = 2;
const K_SERIES_R = 3;
const K_SHUNT_L = 4;
const K_SHUNT_C = 5;
const K_SHUNT_R = 6;
const K_LINE = 7;
const K_OPEN_STUB = 8;
const K_SHORT_STUB = 9;
const K_TRANSFORMER = 10;
const K_TWO_PORT = 11;
/** The kind codes this module's loop uses (for the test that keeps them equal to elements.ts). */
export const CASCADE_KIND_CODES = { K_SERIES_L, K_SERIES_C, K_SERIES_R, K_SHUNT_L, K_SHUNT_C, K_SHUNT_R, K_LINE, K_OPEN_STUB, K_SHORT_STUB, K_TRANSFORMER, K_TWO_PORT };
const OPEN2 = IMPEDANCE_OPEN_OHMS * IMPEDANCE_OPEN_OHMS;

/** What the fast path needs about a design on one frequency grid. */
export interface SweepContext {
  freqs: Float64Array;
  /** Load impedance, interleaved re, im per frequency (ohms). */
  loadZ: Float64Array;
  /** referenceOhms. */
  z0: number;
  /** Port impedance (defaults to [referenceOhms, 0]). */
  zs: [number, number];
}

/** The port impedance of a design. */
export function portImpedance(design: Design): Complex {
  const zs = design.port?.impedance;
  return zs ? [zs[0], zs[1]] : [design.referenceOhms, 0];
}

/** Context for `freqs` (default: the design's sweep). Throws DesignError for a measured load that does not cover them. */
export function sweepContext(design: Design, freqs: Float64Array = sweepFrequencies(design.sweep)): SweepContext {
  return {
    freqs,
    loadZ: loadImpedances(design.load, design.referenceOhms, freqs),
    z0: design.referenceOhms,
    zs: portImpedance(design),
  };
}

/**
 * Input impedance at the port of `elements` (load -> port) terminated by the context's load,
 * interleaved re, im per frequency. Throws DesignError for a two-port whose data do not cover the grid.
 */
export function chainZin(ctx: SweepContext, elements: readonly Element[], out?: Float64Array): Float64Array {
  return chainZinOfPlan(ctx, chainPlan(elements, ctx.freqs), out);
}

/** chainZin for an already compiled plan (its two-port tables, if any, must be for `ctx.freqs`). */
export function chainZinOfPlan(ctx: SweepContext, plan: ChainPlan, out?: Float64Array): Float64Array {
  const { freqs, loadZ } = ctx;
  const n = freqs.length;
  const res = out ?? new Float64Array(2 * n);
  const { kinds, p, tables, count } = plan;
  const angles = lineAngles(plan, freqs);
  const ang = angles.a;
  for (let i = 0; i < n; i++) {
    const f = freqs[i];
    const w = TWO_PI * f;
    lineAnglesAdvance(angles, i, f);
    let nr = loadZ[2 * i];
    let ni = loadZ[2 * i + 1];
    let dr = 1;
    let di = 0;
    for (let e = 0; e < count; e++) {
      const o = 4 * e;
      switch (kinds[e]) {
        case K_SERIES_L: {
          const x = w * p[o];
          const r = x * p[o + 1];
          nr += r * dr - x * di;
          ni += r * di + x * dr;
          break;
        }
        case K_SERIES_C: {
          // N' = N·Y + D, D' = D·Y with Y = ωC/Q + jωC.
          const b = w * p[o];
          const g = b * p[o + 1];
          const tr = nr * g - ni * b + dr;
          const ti = nr * b + ni * g + di;
          const ur = dr * g - di * b;
          di = dr * b + di * g;
          dr = ur;
          nr = tr;
          ni = ti;
          break;
        }
        case K_SERIES_R:
          nr += p[o] * dr;
          ni += p[o] * di;
          break;
        case K_SHUNT_L: {
          // N' = N·Zl, D' = D·Zl + N with Zl = ωL/Q + jωL.
          const x = w * p[o];
          const r = x * p[o + 1];
          const ur = dr * r - di * x + nr;
          const ui = dr * x + di * r + ni;
          const tr = nr * r - ni * x;
          ni = nr * x + ni * r;
          nr = tr;
          dr = ur;
          di = ui;
          break;
        }
        case K_SHUNT_C: {
          const b = w * p[o];
          const g = b * p[o + 1];
          dr += g * nr - b * ni;
          di += g * ni + b * nr;
          break;
        }
        case K_SHUNT_R:
          dr += nr / p[o];
          di += ni / p[o];
          break;
        case K_LINE: {
          const z0 = p[o];
          const c = ang[o];
          const s = ang[o + 1];
          if (p[o + 3] === 0) {
            // Lossless: A = D = cos βl, B = jZ0 sin βl, C = j sin βl / Z0.
            const zs = z0 * s, ys = s / z0;
            const tr = c * nr - zs * di;
            const ti = c * ni + zs * dr;
            const ur = c * dr - ys * ni;
            di = c * di + ys * nr;
            dr = ur;
            nr = tr;
            ni = ti;
            break;
          }
          const ar = p[o + 2] * c, ai = p[o + 3] * s; // cosh γl
          const sr = p[o + 3] * c, si = p[o + 2] * s; // sinh γl
          const br = z0 * sr, bi = z0 * si;
          const cr = sr / z0, ci = si / z0;
          const tr = ar * nr - ai * ni + br * dr - bi * di;
          const ti = ar * ni + ai * nr + br * di + bi * dr;
          const ur = cr * nr - ci * ni + ar * dr - ai * di;
          const ui = cr * ni + ci * nr + ar * di + ai * dr;
          nr = tr;
          ni = ti;
          dr = ur;
          di = ui;
          break;
        }
        case K_OPEN_STUB:
        case K_SHORT_STUB: {
          // Open: N' = N·cosh, D' = D·cosh + N·sinh/z0. Short: the same with cosh and sinh swapped.
          const z0 = p[o];
          const c = ang[o];
          const s = ang[o + 1];
          let ar = p[o + 2] * c, ai = p[o + 3] * s;
          let sr = p[o + 3] * c, si = p[o + 2] * s;
          if (kinds[e] === K_SHORT_STUB) {
            const t1 = ar, t2 = ai;
            ar = sr;
            ai = si;
            sr = t1;
            si = t2;
          }
          sr /= z0;
          si /= z0;
          const ur = dr * ar - di * ai + nr * sr - ni * si;
          const ui = dr * ai + di * ar + nr * si + ni * sr;
          const tr = nr * ar - ni * ai;
          ni = nr * ai + ni * ar;
          nr = tr;
          dr = ur;
          di = ui;
          break;
        }
        case K_TRANSFORMER: {
          const n2 = p[o] * p[o];
          nr *= n2;
          ni *= n2;
          break;
        }
        case K_TWO_PORT: {
          const t = tables[e] as Float64Array;
          const q = 8 * i;
          const tr = t[q] * nr - t[q + 1] * ni + t[q + 2] * dr - t[q + 3] * di;
          const ti = t[q] * ni + t[q + 1] * nr + t[q + 2] * di + t[q + 3] * dr;
          const ur = t[q + 4] * nr - t[q + 5] * ni + t[q + 6] * dr - t[q + 7] * di;
          const ui = t[q + 4] * ni + t[q + 5] * nr + t[q + 6] * di + t[q + 7] * dr;
          nr = tr;
          ni = ti;
          dr = ur;
          di = ui;
          break;
        }
      }
      const m = Math.abs(nr) + Math.abs(ni) + Math.abs(dr) + Math.abs(di);
      if (m > 1e150 || m < 1e-150) {
        if (m === 0) {
          // Only a short followed by a zero-length shorted stub gets here: still a short.
          dr = 1;
        } else {
          const k = 1 / m;
          nr *= k;
          ni *= k;
          dr *= k;
          di *= k;
        }
      }
    }
    impedanceRatio(nr, ni, dr, di, res, 2 * i);
  }
  return res;
}

/** Re-evaluate cos/sin exactly every this many points of a uniform grid (rotation in between). */
const ANGLE_RESYNC = 16;

/**
 * cos βl and sin βl of every line and stub at the current grid point, in one array with the
 * plan's stride: `a[4e]` = cos, `a[4e + 1]` = sin, `a[4e + 2]`, `a[4e + 3]` = cos, sin of the
 * per-step rotation. On a uniformly spaced grid they advance by that fixed rotation (angle addition:
 * 4 multiplications instead of two trigonometric calls) and are recomputed exactly every
 * ANGLE_RESYNC points, which bounds the drift to a few ulps; on any other grid they are computed
 * directly at each point.
 */
export interface LineAngles {
  readonly lines: number[];
  readonly radPerHz: Float64Array;
  readonly a: Float64Array;
  readonly uniform: boolean;
}

export function lineAngles(plan: ChainPlan, freqs: Float64Array): LineAngles {
  const lines: number[] = [];
  for (let e = 0; e < plan.count; e++) {
    const k = plan.kinds[e];
    if (k === K_LINE || k === K_OPEN_STUB || k === K_SHORT_STUB) lines.push(e);
  }
  const n = freqs.length;
  let uniform = n > 2 && lines.length > 0;
  const step = n > 1 ? freqs[1] - freqs[0] : 0;
  for (let i = 2; uniform && i < n; i++) if (Math.abs(freqs[i] - freqs[i - 1] - step) > 1e-12 * Math.abs(freqs[i])) uniform = false;
  const a = new Float64Array(4 * plan.count);
  if (uniform)
    for (const e of lines) {
      a[4 * e + 2] = Math.cos(plan.p[4 * e + 1] * step);
      a[4 * e + 3] = Math.sin(plan.p[4 * e + 1] * step);
    }
  return { lines, radPerHz: plan.p, a, uniform };
}

export function lineAnglesAdvance(angles: LineAngles, i: number, f: number): void {
  const { lines, a } = angles;
  const m = lines.length;
  if (m === 0) return;
  if (!angles.uniform || i % ANGLE_RESYNC === 0) {
    const p = angles.radPerHz;
    for (let j = 0; j < m; j++) {
      const o = 4 * lines[j];
      const th = p[o + 1] * f;
      a[o] = Math.cos(th);
      a[o + 1] = Math.sin(th);
    }
    return;
  }
  for (let j = 0; j < m; j++) {
    const o = 4 * lines[j];
    const c = a[o];
    const s = a[o + 1];
    a[o] = c * a[o + 2] - s * a[o + 3];
    a[o + 1] = s * a[o + 2] + c * a[o + 3];
  }
}

/**
 * N/D into out[o], out[o + 1], clamped to IMPEDANCE_OPEN_OHMS in magnitude (an open keeps the
 * direction of N·conj(D), or of N when D = 0).
 */
export function impedanceRatio(nr: number, ni: number, dr: number, di: number, out: Float64Array, o: number): void {
  const n2 = nr * nr + ni * ni;
  const d2 = dr * dr + di * di;
  if (n2 <= OPEN2 * d2) {
    out[o] = (nr * dr + ni * di) / d2;
    out[o + 1] = (ni * dr - nr * di) / d2;
    return;
  }
  let ur = nr, ui = ni;
  if (d2 > 0) {
    ur = nr * dr + ni * di;
    ui = ni * dr - nr * di;
  }
  const m = Math.sqrt(ur * ur + ui * ui);
  out[o] = (ur / m) * IMPEDANCE_OPEN_OHMS;
  out[o + 1] = (ui / m) * IMPEDANCE_OPEN_OHMS;
}

/**
 * Power-wave reflection Γ = (Zin − Zs*)/(Zin + Zs) at each point (CONTRACT §1), interleaved.
 * Where Zin + Zs = 0 (only possible for an active measured load) Γ is reported as 1.
 */
export function gammaFromZin(zin: Float64Array, zs: [number, number], out?: Float64Array): Float64Array {
  const n = zin.length >> 1;
  const res = out ?? new Float64Array(2 * n);
  const [sr, si] = zs;
  for (let i = 0; i < n; i++) {
    const zr = zin[2 * i];
    const zi = zin[2 * i + 1];
    const ar = zr - sr, ai = zi + si;
    const br = zr + sr, bi = zi + si;
    const d = br * br + bi * bi;
    if (d === 0) {
      res[2 * i] = 1;
      res[2 * i + 1] = 0;
      continue;
    }
    res[2 * i] = (ar * br + ai * bi) / d;
    res[2 * i + 1] = (ai * br - ar * bi) / d;
  }
  return res;
}

/** The largest |Γ| of an interleaved series (0 for an empty one). */
export function gammaMagnitudeMax(gamma: Float64Array): number {
  let m2 = 0;
  for (let i = 0; i < gamma.length; i += 2) {
    const v = gamma[i] * gamma[i] + gamma[i + 1] * gamma[i + 1];
    if (v > m2) m2 = v;
  }
  return Math.sqrt(m2);
}
