/**
 * The parts of an analysis result the panels read. Structural, so that both the engine's own
 * result and the client's re-exported type fit.
 */
import { goalMaxGamma, type Complex, type Design } from '../../../../shared/rf/design';
import { gammaFromVswr } from '../../../../shared/rf/figures';

export interface AnalysisView {
  stagesAtCenter: readonly { after: string; z: Complex }[];
  bandwidth: { lowHz: number; highHz: number; fractional: number } | null;
  worstInBand: { vswr: number | null; returnLossDb: number };
  limit: { model: string; maxFractional: number; ratio: number } | null;
  stressAtCenter?: readonly { id: string; voltagePeak: number; currentPeak: number }[] | null;
}

/** Whether the worst in-band reflection meets the goal. */
export function worstMeetsGoal(design: Design, worst: AnalysisView['worstInBand']): boolean {
  if (worst.vswr === null || !Number.isFinite(worst.vswr)) return false;
  return gammaFromVswr(worst.vswr) <= goalMaxGamma(design.goal) * (1 + 1e-9);
}
