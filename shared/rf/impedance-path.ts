/**
 * The impedance path: at one frequency (the band centre by default), the points on the Γ plane
 * (on referenceOhms) that each element traces as it grows from "absent" to its actual value,
 * for the chart to draw directly. Each segment starts where the previous one ended (the load for
 * the first), so the path is continuous:
 * - series L, C, R: the added impedance grows linearly from 0 to Z_element (series C: reactance
 *   from 0 to −1/ωC rather than C from 0, which would start at an open). With finite Q the loss
 *   grows with it. The trace follows a constant-resistance circle for an ideal reactance.
 * - shunt L, C, R: the added admittance grows linearly from 0 to Y_element (shunt L: susceptance
 *   from 0 to −1/ωL). A constant-conductance circle for an ideal reactance.
 * - open and shorted stubs: drawn like the shunt susceptance they add, grown from 0 to their value
 *   (a shorted stub grown in length would start at a short, away from the previous point).
 * - line: its length grows from 0 (electrical length and loss together): a rotation about the
 *   line's own Z0 (a circle about the centre when Z0 = referenceOhms), spiralling inward with loss.
 * - transformer: the ratio grows from 1 to n (Z scales by the ratio squared).
 * - two-port: no continuous parameter; two points, before and after.
 * Points are spaced adaptively: intervals are halved until neighbouring points are at most
 * `maxStep` apart on the Γ plane (default 0.01), up to `maxPoints` per segment (default 2049).
 *
 * Layout: each segment's `gamma` is a Float64Array of interleaved re, im.
 */
import { smithDiv } from './abcd';
import { type Complex, type Design, type ElementKind } from './design';
import { chainPlan, elementAbcdAt, K_LINE, K_TRANSFORMER, K_TWO_PORT, type ChainPlan } from './elements';
import { centerFrequency } from './frequency';
import { loadImpedances } from './loads';

export interface PathSegment {
  id: string;
  kind: ElementKind;
  /** Interleaved re, im of Γ on referenceOhms, from the previous stage to this element's stage. */
  gamma: Float64Array;
}

export interface ImpedancePath {
  hz: number;
  referenceOhms: number;
  /** Γ of the load. */
  load: Complex;
  segments: PathSegment[];
}

export interface PathOptions {
  maxStep?: number;
  maxPoints?: number;
}

type Pair = [number, number, number, number]; // N (re, im), D (re, im): Z = N/D

/** The element's (N, D) after growing it to fraction t of its value, from the pair before it. */
function grownPair(plan: ChainPlan, e: number, hz: number, before: Pair, t: number, scratch: Float64Array, scaled: ChainPlan): Pair {
  const [nr, ni, dr, di] = before;
  const kind = plan.kinds[e];
  if (kind === K_TWO_PORT || kind === K_LINE || kind === K_TRANSFORMER) {
    let m: Float64Array;
    if (kind === K_TWO_PORT) {
      if (t < 1) return [nr, ni, dr, di];
      m = elementAbcdAt(plan, e, hz, 0, scratch);
    } else {
      // A copy of the element's parameters scaled to fraction t.
      const o = 4 * e;
      scaled.p.set(plan.p.subarray(o, o + 4), o);
      if (kind === K_LINE) {
        const nepers = Math.asinh(plan.p[o + 3]) * t;
        scaled.p[o + 1] = plan.p[o + 1] * t;
        scaled.p[o + 2] = Math.cosh(nepers);
        scaled.p[o + 3] = Math.sinh(nepers);
      } else scaled.p[o] = 1 + t * (plan.p[o] - 1);
      m = elementAbcdAt(scaled, e, hz, 0, scratch);
    }
    return [
      m[0] * nr - m[1] * ni + m[2] * dr - m[3] * di,
      m[0] * ni + m[1] * nr + m[2] * di + m[3] * dr,
      m[4] * nr - m[5] * ni + m[6] * dr - m[7] * di,
      m[4] * ni + m[5] * nr + m[6] * di + m[7] * dr,
    ];
  }
  // Series (B) or shunt (C) element: grow its Z or Y linearly.
  const m = elementAbcdAt(plan, e, hz, 0, scratch);
  const zr = t * m[2], zi = t * m[3], yr = t * m[4], yi = t * m[5];
  return [nr + zr * dr - zi * di, ni + zr * di + zi * dr, dr + yr * nr - yi * ni, di + yr * ni + yi * nr];
}

function gammaOf(pair: Pair, z0: number, out: Float64Array, o: number): void {
  const [nr, ni, dr, di] = pair;
  smithDiv(nr - z0 * dr, ni - z0 * di, nr + z0 * dr, ni + z0 * di, out, o);
}

/** The impedance path of the design's chain at `hz` (default: the band centre). */
export function impedancePath(design: Design, hz = centerFrequency(design), opts: PathOptions = {}): ImpedancePath {
  const maxStep = opts.maxStep ?? 0.01;
  const maxPoints = opts.maxPoints ?? 2049;
  const z0 = design.referenceOhms;
  const freqs = Float64Array.of(hz);
  const plan = chainPlan(design.elements, freqs);
  const scaled: ChainPlan = { ...plan, p: new Float64Array(plan.p) };
  const zl = loadImpedances(design.load, z0, freqs);
  let pair: Pair = [zl[0], zl[1], 1, 0];
  const g0 = new Float64Array(2);
  gammaOf(pair, z0, g0, 0);
  const scratch = new Float64Array(8);
  const tmp = new Float64Array(2);
  const segments: PathSegment[] = design.elements.map((el, e) => {
    const start = pair;
    const at = (t: number): [number, number] => {
      gammaOf(grownPair(plan, e, hz, start, t, scratch, scaled), z0, tmp, 0);
      return [tmp[0], tmp[1]];
    };
    let ts: number[];
    if (plan.kinds[e] === K_TWO_PORT) ts = [0, 1];
    else {
      ts = Array.from({ length: 17 }, (_, k) => k / 16);
      let pts = ts.map(at);
      for (let round = 0; round < 20 && ts.length < maxPoints; round++) {
        const nt: number[] = [ts[0]];
        const np: [number, number][] = [pts[0]];
        let added = false;
        for (let k = 1; k < ts.length; k++) {
          if (nt.length + (ts.length - k) < maxPoints && Math.hypot(pts[k][0] - pts[k - 1][0], pts[k][1] - pts[k - 1][1]) > maxStep) {
            const tm = (ts[k - 1] + ts[k]) / 2;
            nt.push(tm);
            np.push(at(tm));
            added = true;
          }
          nt.push(ts[k]);
          np.push(pts[k]);
        }
        ts = nt;
        pts = np;
        if (!added) break;
      }
    }
    const gamma = new Float64Array(2 * ts.length);
    ts.forEach((t, k) => {
      const [gr, gi] = at(t);
      gamma[2 * k] = gr;
      gamma[2 * k + 1] = gi;
    });
    pair = grownPair(plan, e, hz, start, 1, scratch, scaled);
    const mag = Math.abs(pair[0]) + Math.abs(pair[1]) + Math.abs(pair[2]) + Math.abs(pair[3]);
    if (mag > 1e100) pair = pair.map((v) => v / mag) as Pair;
    return { id: el.id, kind: el.kind, gamma };
  });
  return { hz, referenceOhms: z0, load: [g0[0], g0[1]], segments };
}
