/**
 * The engine's result types as the room screen sees them: re-exported from shared/rf under one
 * import path (`../analysis/engine-types`), so that the chart, the plot and the panels agree.
 *
 * FOR THE WORKSPACE ENGINEER:
 *   AnalysisResult (shared/rf/analyze.ts): Float64Array series; complex series interleaved re, im.
 *   ImpedancePath  (shared/rf/path.ts): { hz, referenceOhms, load: Γ, segments: { id, kind, gamma }[] },
 *                  every point already Γ on referenceOhms.
 *   MatchResult (shared/rf/match.ts), RefineResult / RefineProgress (refine.ts), YieldResult (yield.ts).
 */
export type { Complex, Design } from '../../../../shared/rf/design';
export type { AnalysisResult, Stage } from '../../../../shared/rf/analyze';
export type { ImpedancePath, PathSegment } from '../../../../shared/rf/impedance-path';
export type { MatchCandidate, MatchOptions, MatchResult } from '../../../../shared/rf/match';
import type { RefineProgress } from '../../../../shared/rf/refine';
export type { RefineOptions, RefineProgress, RefineResult } from '../../../../shared/rf/refine';
export type { YieldOptions, YieldResult } from '../../../../shared/rf/yield';

/** What refine reports while it runs: the engine's progress plus `worst` (= worstGamma, best worst-in-band |Γ| so far). */
export type RefineTick = RefineProgress & { worst: number };
