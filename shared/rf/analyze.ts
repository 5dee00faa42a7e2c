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
import { sFromAbcd, smithDiv } from './abcd';
import { bandwidthAround, worstInBand, type Bandwidth, type WorstInBand } from './bandwidth';
import { chainZin, gammaFromZin, impedanceRatio, portImpedance, sweepContext } from './cascade';
import { goalMaxGamma, type Complex, type Design } from './design';
import {
  chainPlan,
  K_LINE,
  K_OPEN_STUB,
  K_SERIES_C,
  K_SERIES_L,
  K_SERIES_R,
  K_SHORT_STUB,
  K_SHUNT_C,
  K_SHUNT_L,
  K_SHUNT_R,
  K_TRANSFORMER,
  K_TWO_PORT,
  SHORT_STUB_MIN_SINH,
  type ChainPlan,
} from './elements';
import { mismatchLossDbFromGamma, returnLossDbFromGamma, vswrFromGamma } from './figures';
import { centerFrequency, sweepFrequencies } from './frequency';
import { bodeFanoLimit, type Limit } from './limit';
import { loadImpedances } from './loads';
import { chainNodesAt, nodeImpedances, stressAt, type ElementStress } from './stress';

const TWO_PI = 2 * Math.PI;

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
  const t = new Float64Array(8);
  const sOut = new Float64Array(8);
  const { kinds, p, tables, count } = plan;
  const [zsr, zsi] = zs;

  for (let i = 0; i < n; i++) {
    const f = freqs[i];
    const w = TWO_PI * f;
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
          const th = p[o + 1] * f;
          const c = Math.cos(th);
          const s = Math.sin(th);
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
          const th = p[o + 1] * f;
          const c = Math.cos(th);
          const s = Math.sin(th);
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

    const lr = loadZ[2 * i];
    const li = loadZ[2 * i + 1];
    const nr = ar * lr - ai * li + br;
    const ni = ar * li + ai * lr + bi;
    const qr = cr * lr - ci * li + dr;
    const qi = cr * li + ci * lr + di;
    impedanceRatio(nr, ni, qr, qi, zin, 2 * i);
    // Γ = (N − Zs*·D')/(N + Zs·D')
    const gnr = nr - (zsr * qr + zsi * qi);
    const gni = ni - (zsr * qi - zsi * qr);
    const gdr = nr + (zsr * qr - zsi * qi);
    const gdi = ni + (zsr * qi + zsi * qr);
    smithDiv(gnr, gni, gdr, gdi, gamma, 2 * i);
    const gr = gamma[2 * i];
    const gi = gamma[2 * i + 1];
    const mag = Math.sqrt(gr * gr + gi * gi);
    gammaMagnitude[i] = mag;
    vswr[i] = vswrFromGamma(mag);
    returnLossDb[i] = returnLossDbFromGamma(mag);
    mismatchLossDb[i] = mismatchLossDbFromGamma(mag);
    // 4·Re Z_L·Re Zs/|Vs|², computed as a ratio of scaled terms so large matrices cannot overflow.
    const sc = Math.max(Math.abs(gdr), Math.abs(gdi));
    const pw = sc > 0 ? (4 * (lr / sc) * (zsr / sc)) / ((gdr / sc) ** 2 + (gdi / sc) ** 2) : 0;
    powerToLoad[i] = Number.isFinite(pw) ? pw : 0;

    t[0] = ar; t[1] = ai; t[2] = br; t[3] = bi; t[4] = cr; t[5] = ci; t[6] = dr; t[7] = di;
    sFromAbcd(t, 0, z0, sOut, 0);
    s11[2 * i] = sOut[0]; s11[2 * i + 1] = sOut[1];
    s12[2 * i] = sOut[2]; s12[2 * i + 1] = sOut[3];
    s21[2 * i] = sOut[4]; s21[2 * i + 1] = sOut[5];
    s22[2 * i] = sOut[6]; s22[2 * i + 1] = sOut[7];
  }
  return { zin, gamma, gammaMagnitude, vswr, returnLossDb, mismatchLossDb, powerToLoad, s: { s11, s21, s12, s22 } };
}

/** |Γ| at arbitrary frequencies through the fast path. */
function gammaMagnitudesAt(design: Design, freqs: Float64Array): Float64Array {
  const ctx = sweepContext(design, freqs);
  const g = gammaFromZin(chainZin(ctx, design.elements), ctx.zs);
  const out = new Float64Array(freqs.length);
  for (let i = 0; i < freqs.length; i++) out[i] = Math.hypot(g[2 * i], g[2 * i + 1]);
  return out;
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
  const [gCenter, gStart, gStop] = gammaMagnitudesAt(design, Float64Array.of(centerHz, startHz, stopHz));

  const bandwidth = bandwidthAround(freqs, out.gammaMagnitude, centerHz, gCenter, maxGamma);
  const worst = worstInBand(freqs, out.gammaMagnitude, startHz, stopHz, [gStart, gStop]);
  const limit = bodeFanoLimit(design, centerHz, maxGamma, bandwidth ? bandwidth.fractional : null);

  const zl = loadImpedances(design.load, design.referenceOhms, Float64Array.of(centerHz));
  const stagesZ = nodeImpedances(chainNodesAt(design.elements, [zl[0], zl[1]], centerHz));
  const stagesAtCenter: Stage[] = stagesZ.map((z, k) => ({ after: k === 0 ? 'load' : design.elements[k - 1].id, z }));
  const stressAtCenter = design.drive ? stressAt(design, centerHz, design.drive.powerW) : null;

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
