/** Headline figures stored with a snapshot, so a list can compare snapshots without re-analysing. */
import type { Design } from '../../shared/rf/design';

export interface DesignFigures {
  partCount: number;
  worstInBand: { vswr: number | null; returnLossDb: number } | null;
  bandwidth: { lowHz: number; highHz: number; fractional: number } | null;
  /** false when the engine could not analyse the design (the figures above are then null). */
  analysed: boolean;
}

export function designFigures(design: Design): DesignFigures {
  return { partCount: design.elements.length, worstInBand: null, bandwidth: null, analysed: false };
}
