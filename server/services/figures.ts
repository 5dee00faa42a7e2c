/**
 * Headline figures stored with a snapshot, so a list can compare snapshots without re-analysing:
 * part count, worst in-band VSWR and return loss, bandwidth against the goal, and whether the goal is met,
 * from the engine's `analyze()` (CONTRACT §3).
 */
import { analyze } from '../../shared/rf/index';
import type { Design } from '../../shared/rf/design';

export interface DesignFigures {
  partCount: number;
  /** `vswr` is null where |Γ| ≥ 1 somewhere in the band. */
  worstInBand: { vswr: number | null; returnLossDb: number | null } | null;
  bandwidth: { lowHz: number; highHz: number; fractional: number } | null;
  /** true when the worst in-band figure meets the goal. */
  goalMet: boolean | null;
  /** false when the engine could not analyse the design (the figures above are then null). */
  analysed: boolean;
}

const finiteOrNull = (x: number): number | null => (Number.isFinite(x) ? x : null);

export function designFigures(design: Design): DesignFigures {
  const partCount = design.elements.length;
  try {
    const r = analyze(design);
    return {
      partCount,
      worstInBand: {
        vswr: finiteOrNull(r.worstInBand.vswr),
        returnLossDb: finiteOrNull(r.worstInBand.returnLossDb),
      },
      bandwidth: r.bandwidth
        ? { lowHz: r.bandwidth.lowHz, highHz: r.bandwidth.highHz, fractional: r.bandwidth.fractional }
        : null,
      goalMet: r.worstInBand.gammaMagnitude <= r.maxGamma,
      analysed: true,
    };
  } catch {
    // A design the engine refuses (e.g. a sweep outside a measured load's range) is still worth keeping.
    return { partCount, worstInBand: null, bandwidth: null, goalMet: null, analysed: false };
  }
}
