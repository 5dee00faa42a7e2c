/**
 * The engine's result types as the room screen sees them.
 *
 * FOR THE WORKSPACE ENGINEER: import these names from here (not from shared/rf directly), so that
 * the chart, the plot and the panels agree on one spelling while the engine files land. Once
 * `shared/rf/index.ts`, `path.ts`, `match.ts`, `refine.ts` and `yield.ts` export their own types,
 * this file re-exports them under the same names.
 *
 * Shapes follow CONTRACT.md §3: numeric series are `Float64Array`s, complex series are interleaved
 * `[re0, im0, re1, im1, ...]` `Float64Array`s.
 */
import type { Complex, Design } from '../../../../shared/rf/design';

export type { Complex, Design };

export interface Stage {
  /** "load" or the id of the element after which this impedance is seen */
  after: string;
  z: Complex;
}

export interface AnalysisResult {
  frequenciesHz: Float64Array;
  zin: Float64Array;
  gamma: Float64Array;
  vswr: Float64Array;
  returnLossDb: Float64Array;
  mismatchLossDb: Float64Array;
  powerToLoad: Float64Array;
  s: { s11: Float64Array; s21: Float64Array; s12: Float64Array; s22: Float64Array };
  stagesAtCenter: Stage[];
  bandwidth: { lowHz: number; highHz: number; fractional: number } | null;
  worstInBand: { vswr: number | null; returnLossDb: number };
  limit: { model: string; maxFractional: number; ratio: number } | null;
  stressAtCenter?: { id: string; voltagePeak: number; currentPeak: number }[];
}

/** One element's stretch of the impedance path at the centre frequency: impedances from the stage before to the stage after. */
export interface PathSegment {
  elementId: string;
  kind: string;
  /** interleaved impedances [re, im, ...] along the element's travel */
  z: Float64Array;
}

export interface ImpedancePath {
  load: Complex;
  segments: PathSegment[];
}

export type MatchResult = { candidates: { topology: string; elements: Design['elements'] }[] };
export type RefineResult = { design: Design; worstInBand: { vswr: number | null; returnLossDb: number }; iterations: number };
export type YieldResult = {
  trials: number;
  passFraction: number;
  worstVswr: { p50: number | null; p95: number | null; max: number | null };
  envelope?: { minGamma: Float64Array; maxGamma: Float64Array };
};
