/**
 * A snapshot as one row of the snapshot table: the values the columns sort and filter on, and the
 * words they show. Pure, so the table's order and text are tested without a browser.
 */
import type { Snapshot } from '../../../../shared/api/snapshots';
import { formatEngineering } from '../../../../shared/rf/units';

export interface SnapshotRow {
  id: string;
  label: string;
  who: string;
  /** Unix milliseconds. */
  createdAt: number;
  /** Fractional bandwidth meeting the goal around the centre, or null (goal missed at the centre, not analysed). */
  bandwidth: number | null;
  bandwidthText: string;
  /** Worst VSWR in the band; null when not analysed; Infinity where |Γ| ≥ 1. */
  worstVswr: number | null;
  worstVswrText: string;
  partCount: number | null;
  forReview: boolean;
  goalMet: boolean | null;
  snapshot: Snapshot;
}

const percent = (fraction: number) => `${(fraction * 100).toPrecision(fraction >= 0.1 ? 3 : 2)} %`;

export function bandwidthText(snapshot: Snapshot): string {
  const f = snapshot.figures;
  if (!f || !f.analysed) return 'not analysed';
  if (!f.bandwidth) return 'goal missed at the centre';
  const { lowHz, highHz, fractional } = f.bandwidth;
  return `${formatEngineering(lowHz, 'Hz', { digits: 4 })} – ${formatEngineering(highHz, 'Hz', { digits: 4 })} (${percent(fractional)})`;
}

export function worstVswrOf(snapshot: Snapshot): number | null {
  const f = snapshot.figures;
  if (!f || !f.analysed || !f.worstInBand) return null;
  // The server sends null for a VSWR that is infinite (|Γ| ≥ 1 somewhere in the band).
  return f.worstInBand.vswr ?? Infinity;
}

export function worstVswrText(vswr: number | null): string {
  if (vswr === null) return 'not analysed';
  if (!Number.isFinite(vswr)) return '∞ (total reflection)';
  return vswr.toFixed(vswr < 10 ? 2 : 1);
}

export function snapshotRow(snapshot: Snapshot): SnapshotRow {
  const worst = worstVswrOf(snapshot);
  const f = snapshot.figures;
  return {
    id: snapshot.id,
    label: snapshot.label,
    who: snapshot.createdBy?.displayName ?? 'a former member',
    createdAt: snapshot.createdAt,
    bandwidth: f?.analysed && f.bandwidth ? f.bandwidth.fractional : null,
    bandwidthText: bandwidthText(snapshot),
    worstVswr: worst,
    worstVswrText: worstVswrText(worst),
    partCount: f ? f.partCount : null,
    forReview: snapshot.forReview,
    goalMet: f?.analysed ? f.goalMet : null,
    snapshot,
  };
}
