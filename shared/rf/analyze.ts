/**
 * `analyze(design)`: the chain's full analysis over the sweep (CONTRACT §3).
 *
 * The sweep loop builds the chain's ABCD matrix T at each point by left-multiplying the element
 * matrices from the load outward (T = M_last ··· M_0), specialised per kind (a series Z touches
 * only A and B, a shunt Y only C and D). From T and the load Z_L:
 *   N = A·Z_L + B, D' = C·Z_L + D (port voltage and current for a load current of 1),
 *   Zin = N/D', Γ = (N − Zs*·D')/(N + Zs·D')  (power waves; exact even where Zin is an open),
 *   powerToLoad = 4·Re Z_L·Re Zs / |N + Zs·D'|²  (P_load / P_available),
 *   S of the chain alone from T on referenceOhms (abcd.ts, Pozar Table 4.2).
 * Nothing is allocated per point. See README.md for units, layouts and null conventions.
 */
import { bandwidthAround, worstInBand, type Bandwidth, type WorstInBand } from './bandwidth';
import { chainZin, chainZinOfPlan, gammaFromZin, impedanceRatio, lineAngles, lineAnglesAdvance, portImpedance, sweepContext } from './cascade';
import { IMPEDANCE_OPEN_OHMS } from './complex';
import { goalMaxGamma, type Complex, type Design } from './design';
import { chainPlan, type ChainPlan } from './elements';
import { RETURN_LOSS_FLOOR_GAMMA } from './figures';
import { centerFrequency, sweepFrequencies } from './frequency';
import { bodeFanoLimit, type Limit } from './limit';
import { loadImpedances } from './loads';
import { chainNodesAt, nodeImpedances, stressFromNodes, type ElementStress } from './stress';

const TWO_PI = 2 * Math.PI;
// Kind codes and the stub floor of elements.ts, repeated so the hot switch compares against local
// constants (see cascade.ts); tests/rf/kind-codes.test.ts keeps the copies equal.
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
const SHORT_STUB_MIN_SINH = 1e-60;
const OPEN2 = IMPEDANCE_OPEN_OHMS * IMPEDANCE_OPEN_OHMS;
const RL_FLOOR = RETURN_LOSS_FLOOR_GAMMA;
const advanceAngles = lineAnglesAdvance;
/** The codes this module's loop uses (for the test that keeps them equal to elements.ts). */
export const ANALYZE_KIND_CODES = { K_SERIES_L, K_SERIES_C, K_SERIES_R, K_SHUNT_L, K_SHUNT_C, K_SHUNT_R, K_LINE, K_OPEN_STUB, K_SHORT_STUB, K_TRANSFORMER, K_TWO_PORT, SHORT_STUB_MIN_SINH };

export interface Stage {
  /** "load", or the id of the element after which the impedance is taken. */
  after: string;
  z: Complex;
}

/** Chain S-parameters, each interleaved re, im per frequency. */
export interface ChainS {
  s11: Float64Array;
  s21: Float64Array;
  s12: Float64Array;
  s22: Float64Array;
}

export interface AnalysisResult {
  frequenciesHz: Float64Array;
  /** Interleaved re, im (ohms), finite: an open is IMPEDANCE_OPEN_OHMS in magnitude. */
  zin: Float64Array;
  /** Interleaved re, im. */
  gamma: Float64Array;
  gammaMagnitude: Float64Array;
  /** Infinity where |Γ| ≥ 1 (JSON null). */
  vswr: Float64Array;
  /** At most 300 dB (|Γ| floored at 1e-15). */
  returnLossDb: Float64Array;
  /** Infinity where |Γ| ≥ 1 (JSON null). */
  mismatchLossDb: Float64Array;
  powerToLoad: Float64Array;
  s: ChainS;
  centerHz: number;
  /** The goal as |Γ|max. */
  maxGamma: number;
  /** |Γ| at the band centre, start and stop, computed exactly there. */
  centerGamma: number;
  stagesAtCenter: Stage[];
  bandwidth: Bandwidth | null;
  worstInBand: WorstInBand;
  limit: Limit | null;
  /** null when the design has no `drive`. */
  stressAtCenter: ElementStress[] | null;
}

interface SweepOutputs {
  zin: Float64Array;
  gamma: Float64Array;
  gammaMagnitude: Float64Array;
  vswr: Float64Array;
  returnLossDb: Float64Array;
  mismatchLossDb: Float64Array;
  powerToLoad: Float64Array;
  s: ChainS;
}

/** The sweep loop (see the module comment). */
function chainSweep(plan: ChainPlan, freqs: Float64Array, loadZ: Float64Array, z0: number, zs: Complex): SweepOutputs {
  const n = freqs.length;
  const zin = new Float64Array(2 * n);
  const gamma = new Float64Array(2 * n);
  const gammaMagnitude = new Float64Array(n);
  const vswr = new Float64Array(n);
  const returnLossDb = new Float64Array(n);
  const mismatchLossDb = new Float64Array(n);
  const powerToLoad = new Float64Array(n);
  const s11 = new Float64Array(2 * n);
  const s21 = new Float64Array(2 * n);
  const s12 = new Float64Array(2 * n);
  const s22 = new Float64Array(2 * n);
  const { kinds, p, tables, count } = plan;
  const angles = lineAngles(plan, freqs);
  const ang = angles.a;
  const [zsr, zsi] = zs;
  const iz0 = 1 / z0;

  for (let i = 0; i < n; i++) {
    const f = freqs[i];
    const w = TWO_PI * f;
    advanceAngles(angles, i, f);
    let ar = 1, ai = 0, br = 0, bi = 0, cr = 0, ci = 0, dr = 1, di = 0;
    for (let e = 0; e < count; e++) {
      const o = 4 * e;
      // Series element Z = (zr, zi): A += Z·C, B += Z·D. Shunt Y = (yr, yi): C += Y·A, D += Y·B.
      let zr = 0, zi = 0, yr = 0, yi = 0;
      let series = true;
      switch (kinds[e]) {
        case K_SERIES_L: {
          zi = w * p[o];
          zr = zi * p[o + 1];
          break;
        }
        case K_SERIES_C: {
          const b = w * p[o];
          const g = b * p[o + 1];
          const d = g * g + b * b;
          zr = g / d;
          zi = -b / d;
          break;
        }
        case K_SERIES_R:
          zr = p[o];
          break;
        case K_SHUNT_L: {
          const x = w * p[o];
          const r = x * p[o + 1];
          const d = r * r + x * x;
          yr = r / d;
          yi = -x / d;
          series = false;
          break;
        }
        case K_SHUNT_C: {
          yi = w * p[o];
          yr = yi * p[o + 1];
          series = false;
          break;
        }
        case K_SHUNT_R:
          yr = 1 / p[o];
          series = false;
          break;
        case K_LINE: {
          const z0l = p[o];
          const c = ang[o];
          const s = ang[o + 1];
          if (p[o + 3] === 0) {
            // Lossless: [cos, jZ0 sin; j sin/Z0, cos]·T.
            const bs = z0l * s, cs1 = s / z0l;
            const nar = c * ar - bs * ci, nai = c * ai + bs * cr;
            const nbr = c * br - bs * di, nbi = c * bi + bs * dr;
            const ncr = c * cr - cs1 * ai, nci = c * ci + cs1 * ar;
            const ndr = c * dr - cs1 * bi, ndi = c * di + cs1 * br;
            ar = nar; ai = nai; br = nbr; bi = nbi; cr = ncr; ci = nci; dr = ndr; di = ndi;
            continue;
          }
          const mr = p[o + 2] * c, mi = p[o + 3] * s; // cosh γl (A and D of the line)
          const sr = p[o + 3] * c, si = p[o + 2] * s; // sinh γl
          const lbr = z0l * sr, lbi = z0l * si;
          const lcr = sr / z0l, lci = si / z0l;
          const nar = mr * ar - mi * ai + lbr * cr - lbi * ci;
          const nai = mr * ai + mi * ar + lbr * ci + lbi * cr;
          const nbr = mr * br - mi * bi + lbr * dr - lbi * di;
          const nbi = mr * bi + mi * br + lbr * di + lbi * dr;
          const ncr = lcr * ar - lci * ai + mr * cr - mi * ci;
          const nci = lcr * ai + lci * ar + mr * ci + mi * cr;
          const ndr = lcr * br - lci * bi + mr * dr - mi * di;
          const ndi = lcr * bi + lci * br + mr * di + mi * dr;
          ar = nar; ai = nai; br = nbr; bi = nbi; cr = ncr; ci = nci; dr = ndr; di = ndi;
          continue;
        }
        case K_OPEN_STUB:
        case K_SHORT_STUB: {
          const z0l = p[o];
          const c = ang[o];
          const s = ang[o + 1];
          const chr = p[o + 2] * c, chi = p[o + 3] * s;
          const shr = p[o + 3] * c, shi = p[o + 2] * s;
          let nr = shr, ni = shi, qr = chr, qi = chi; // Y·z0 = num/den
          if (kinds[e] === K_SHORT_STUB) {
            nr = chr; ni = chi; qr = shr; qi = shi;
            if (Math.abs(qr) + Math.abs(qi) < SHORT_STUB_MIN_SINH) {
              qr = SHORT_STUB_MIN_SINH;
              qi = 0;
            }
          }
          const d = (qr * qr + qi * qi) * z0l;
          yr = (nr * qr + ni * qi) / d;
          yi = (ni * qr - nr * qi) / d;
          series = false;
          break;
        }
        case K_TRANSFORMER: {
          const n1 = p[o];
          const inv = 1 / n1;
          ar *= n1; ai *= n1; br *= n1; bi *= n1;
          cr *= inv; ci *= inv; dr *= inv; di *= inv;
          continue;
        }
        case K_TWO_PORT: {
          const m = tables[e] as Float64Array;
          const q = 8 * i;
          const mar = m[q], mai = m[q + 1], mbr = m[q + 2], mbi = m[q + 3];
          const mcr = m[q + 4], mci = m[q + 5], mdr = m[q + 6], mdi = m[q + 7];
          const nar = mar * ar - mai * ai + mbr * cr - mbi * ci;
          const nai = mar * ai + mai * ar + mbr * ci + mbi * cr;
          const nbr = mar * br - mai * bi + mbr * dr - mbi * di;
          const nbi = mar * bi + mai * br + mbr * di + mbi * dr;
          const ncr = mcr * ar - mci * ai + mdr * cr - mdi * ci;
          const nci = mcr * ai + mci * ar + mdr * ci + mdi * cr;
          const ndr = mcr * br - mci * bi + mdr * dr - mdi * di;
          const ndi = mcr * bi + mci * br + mdr * di + mdi * dr;
          ar = nar; ai = nai; br = nbr; bi = nbi; cr = ncr; ci = nci; dr = ndr; di = ndi;
          continue;
        }
      }
      if (series) {
        ar += zr * cr - zi * ci;
        ai += zr * ci + zi * cr;
        br += zr * dr - zi * di;
        bi += zr * di + zi * dr;
      } else {
        cr += yr * ar - yi * ai;
        ci += yr * ai + yi * ar;
        dr += yr * br - yi * bi;
        di += yr * bi + yi * br;
      }
    }

    const o2 = 2 * i;
    const lr = loadZ[o2];
    const li = loadZ[o2 + 1];
    // N = A·Z_L + B, D' = C·Z_L + D.
    const nr = ar * lr - ai * li + br;
    const ni = ar * li + ai * lr + bi;
    const qr = cr * lr - ci * li + dr;
    const qi = cr * li + ci * lr + di;
    const n2 = nr * nr + ni * ni;
    const q2 = qr * qr + qi * qi;
    if (n2 <= OPEN2 * q2) {
      const iq = 1 / q2;
      zin[o2] = (nr * qr + ni * qi) * iq;
      zin[o2 + 1] = (ni * qr - nr * qi) * iq;
    } else impedanceRatio(nr, ni, qr, qi, zin, o2);

    // Γ = (N − Zs*·D')/(N + Zs·D'); Vs = N + Zs·D' for a load current of 1.
    const gnr = nr - (zsr * qr + zsi * qi);
    const gni = ni - (zsr * qi - zsi * qr);
    const vsr = nr + (zsr * qr - zsi * qi);
    const vsi = ni + (zsr * qi + zsi * qr);
    const v2 = vsr * vsr + vsi * vsi;
    let gr: number, gi: number, pw: number;
    if (v2 > 1e-300 && v2 < 1e300) {
      const iv = 1 / v2;
      gr = (gnr * vsr + gni * vsi) * iv;
      gi = (gni * vsr - gnr * vsi) * iv;
      // P_load/P_avail = 4·Re Z_L·Re Zs/|Vs|².
      pw = 4 * lr * zsr * iv;
    } else {
      // Rescale first so that huge (or tiny) chain matrices cannot overflow.
      const vm = Math.abs(vsr) > Math.abs(vsi) ? Math.abs(vsr) : Math.abs(vsi);
      const k = vm > 0 ? 1 / vm : 0;
      const ur = vsr * k, ui = vsi * k;
      const u2 = ur * ur + ui * ui;
      gr = (gnr * k * ur + gni * k * ui) / u2;
      gi = (gni * k * ur - gnr * k * ui) / u2;
      pw = (4 * (lr * k) * (zsr * k)) / u2;
      if (!Number.isFinite(pw)) pw = 0;
    }
    gamma[o2] = gr;
    gamma[o2 + 1] = gi;
    gammaMagnitude[i] = Math.sqrt(gr * gr + gi * gi);
    powerToLoad[i] = pw;

    // Chain S on z0 (Pozar Table 4.2): Δ = A + B/z0 + C·z0 + D.
    const bnr = br * iz0, bni = bi * iz0, czr = cr * z0, czi = ci * z0;
    const er = ar + bnr + czr + dr, ei = ai + bni + czi + di;
    const e2 = er * er + ei * ei;
    let xr: number, xi: number; // 1/Δ
    if (e2 > 1e-300 && e2 < 1e300) {
      const ie = 1 / e2;
      xr = er * ie;
      xi = -ei * ie;
    } else {
      const em = Math.abs(er) > Math.abs(ei) ? Math.abs(er) : Math.abs(ei);
      const hr = er / em, hi = ei / em;
      const h2 = (hr * hr + hi * hi) * em;
      xr = hr / h2;
      xi = -hi / h2;
    }
    const s11r = ar + bnr - czr - dr, s11i = ai + bni - czi - di;
    s11[o2] = s11r * xr - s11i * xi;
    s11[o2 + 1] = s11r * xi + s11i * xr;
    const s22r = -ar + bnr - czr + dr, s22i = -ai + bni - czi + di;
    s22[o2] = s22r * xr - s22i * xi;
    s22[o2 + 1] = s22r * xi + s22i * xr;
    s21[o2] = 2 * xr;
    s21[o2 + 1] = 2 * xi;
    const detr = ar * dr - ai * di - (br * cr - bi * ci);
    const deti = ar * di + ai * dr - (br * ci + bi * cr);
    s12[o2] = 2 * (detr * xr - deti * xi);
    s12[o2 + 1] = 2 * (detr * xi + deti * xr);
  }
  reflectionFigures(gammaMagnitude, vswr, returnLossDb, mismatchLossDb);
  return { zin, gamma, gammaMagnitude, vswr, returnLossDb, mismatchLossDb, powerToLoad, s: { s11, s21, s12, s22 } };
}

/** VSWR, return loss and mismatch loss from |Γ| (figures.ts conventions, inlined in a tight second pass). */
function reflectionFigures(mags: Float64Array, vswr: Float64Array, returnLossDb: Float64Array, mismatchLossDb: Float64Array): void {
  for (let i = 0; i < mags.length; i++) {
    const mag = mags[i];
    if (mag >= 1) {
      vswr[i] = Infinity;
      mismatchLossDb[i] = Infinity;
    } else {
      vswr[i] = (1 + mag) / (1 - mag);
      mismatchLossDb[i] = -10 * Math.log10(1 - mag * mag);
    }
    returnLossDb[i] = -20 * Math.log10(mag > RL_FLOOR ? mag : RL_FLOOR);
  }
}

/**
 * The full analysis of a checked design (from `parseDesign`). Throws DesignError (with the JSON
 * path) for measured data that do not parse or do not cover the frequencies needed.
 */
export function analyze(design: Design): AnalysisResult {
  const freqs = sweepFrequencies(design.sweep);
  const loadZ = loadImpedances(design.load, design.referenceOhms, freqs);
  const plan = chainPlan(design.elements, freqs);
  const zs = portImpedance(design);
  const out = chainSweep(plan, freqs, loadZ, design.referenceOhms, zs);

  const centerHz = centerFrequency(design);
  const maxGamma = goalMaxGamma(design.goal);
  const { startHz, stopHz } = design.band;
  // The centre and both band edges, exactly (fast path on a 3-point grid).
  const extra = sweepContext(design, Float64Array.of(centerHz, startHz, stopHz));
  const reusable = plan.tables.every((t) => t === null); // two-port tables are per grid point
  const g = gammaFromZin(reusable ? chainZinOfPlan(extra, plan) : chainZin(extra, design.elements), extra.zs);
  const [gCenter, gStart, gStop] = [0, 1, 2].map((k) => Math.hypot(g[2 * k], g[2 * k + 1]));

  const bandwidth = bandwidthAround(freqs, out.gammaMagnitude, centerHz, gCenter, maxGamma);
  const worst = worstInBand(freqs, out.gammaMagnitude, startHz, stopHz, [gStart, gStop]);
  const limit = bodeFanoLimit(design, centerHz, maxGamma, bandwidth ? bandwidth.fractional : null);

  const nodes = chainNodesAt(design.elements, [extra.loadZ[0], extra.loadZ[1]], centerHz, plan);
  const stagesAtCenter: Stage[] = nodeImpedances(nodes).map((z, k) => ({ after: k === 0 ? 'load' : design.elements[k - 1].id, z }));
  const stressAtCenter = design.drive ? stressFromNodes(design, nodes, design.drive.powerW) : null;

  return {
    frequenciesHz: freqs,
    ...out,
    centerHz,
    maxGamma,
    centerGamma: gCenter,
    stagesAtCenter,
    bandwidth,
    worstInBand: worst,
    limit,
    stressAtCenter,
  };
}
