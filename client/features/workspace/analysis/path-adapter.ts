/**
 * Reads the engine's impedance path (shared/rf/path.ts) into what the chart draws: one run of Γ
 * points per element, load -> port, and the load's Γ where the path starts. The only place that
 * knows the path's shape, so a change there touches one file.
 */
import type { Complex } from '../../../../shared/rf/design';
import type { ImpedancePath } from './engine-types';

export interface PathRun {
  elementId: string;
  kind: string;
  /** interleaved Γ on the path's reference impedance */
  gamma: Float64Array;
}

export function pathRunsOf(path: ImpedancePath): PathRun[] {
  return path.segments.map((s) => ({ elementId: s.id, kind: s.kind, gamma: s.gamma }));
}

/** Γ of the load, where the path starts. */
export function pathStartOf(path: ImpedancePath): Complex | null {
  return path.load ?? null;
}
