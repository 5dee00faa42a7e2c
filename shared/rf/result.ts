/**
 * `resultToJson`: the analysis as exactly the JSON of CONTRACT §3. Complex series become
 * `[[re, im], ...]`; a non-finite number (an infinite VSWR or mismatch loss where |Γ| ≥ 1)
 * becomes `null`, so the output never holds NaN or Infinity.
 */
import { type AnalysisResult } from './analyze';
import { type Complex } from './design';

export type JsonNumber = number | null;

export interface AnalysisJson {
  frequenciesHz: number[];
  zin: Complex[];
  gamma: Complex[];
  vswr: JsonNumber[];
  returnLossDb: JsonNumber[];
  mismatchLossDb: JsonNumber[];
  powerToLoad: JsonNumber[];
  s: { s11: Complex[]; s21: Complex[]; s12: Complex[]; s22: Complex[] };
  stagesAtCenter: { after: string; z: Complex }[];
  bandwidth: { lowHz: number; highHz: number; fractional: number } | null;
  worstInBand: { vswr: JsonNumber; returnLossDb: JsonNumber };
  limit: { model: string; maxFractional: number; ratio: number } | null;
  stressAtCenter: { id: string; voltagePeak: number; currentPeak: number }[] | null;
}

const num = (x: number): JsonNumber => (Number.isFinite(x) ? x : null);
/** A complex component is finite by construction; 0 stands in should one ever not be. */
const part = (x: number): number => (Number.isFinite(x) ? x : 0);

export function realSeriesToJson(a: Float64Array): JsonNumber[] {
  const out = new Array<JsonNumber>(a.length);
  for (let i = 0; i < a.length; i++) out[i] = num(a[i]);
  return out;
}

export function complexSeriesToJson(a: Float64Array): Complex[] {
  const n = a.length >> 1;
  const out = new Array<Complex>(n);
  for (let i = 0; i < n; i++) out[i] = [part(a[2 * i]), part(a[2 * i + 1])];
  return out;
}

export function resultToJson(r: AnalysisResult): AnalysisJson {
  return {
    frequenciesHz: Array.from(r.frequenciesHz),
    zin: complexSeriesToJson(r.zin),
    gamma: complexSeriesToJson(r.gamma),
    vswr: realSeriesToJson(r.vswr),
    returnLossDb: realSeriesToJson(r.returnLossDb),
    mismatchLossDb: realSeriesToJson(r.mismatchLossDb),
    powerToLoad: realSeriesToJson(r.powerToLoad),
    s: {
      s11: complexSeriesToJson(r.s.s11),
      s21: complexSeriesToJson(r.s.s21),
      s12: complexSeriesToJson(r.s.s12),
      s22: complexSeriesToJson(r.s.s22),
    },
    stagesAtCenter: r.stagesAtCenter.map((st) => ({ after: st.after, z: [part(st.z[0]), part(st.z[1])] as Complex })),
    bandwidth: r.bandwidth ? { lowHz: r.bandwidth.lowHz, highHz: r.bandwidth.highHz, fractional: r.bandwidth.fractional } : null,
    worstInBand: { vswr: num(r.worstInBand.vswr), returnLossDb: num(r.worstInBand.returnLossDb) },
    limit: r.limit ? { model: r.limit.model, maxFractional: r.limit.maxFractional, ratio: r.limit.ratio } : null,
    stressAtCenter: r.stressAtCenter ? r.stressAtCenter.map((x) => ({ id: x.id, voltagePeak: x.voltagePeak, currentPeak: x.currentPeak })) : null,
  };
}
