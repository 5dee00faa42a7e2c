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
export type { AnalysisResult, Stage } from '../../../../shared/rf/analyze';
export type { MatchCandidate, MatchOptions, MatchResult } from '../../../../shared/rf/match';

export type { Complex, Design };

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

export type RefineResult = { design: Design; worstInBand: { vswr: number | null; returnLossDb: number }; iterations: number };
export type YieldResult = {
  trials: number;
  passFraction: number;
  worstVswr: { p50: number | null; p95: number | null; max: number | null };
  envelope?: { minGamma: Float64Array; maxGamma: Float64Array };
};
