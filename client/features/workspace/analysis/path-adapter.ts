/**
 * Reads the engine's impedance path (shared/rf/path.ts) into what the chart draws: one run of
 * impedances per element, load -> port, and the load's impedance where the path starts.
 * The only place that knows the path's shape, so a change there touches one file.
 */
import type { Complex, Design } from '../../../../shared/rf/design';
import type { AnalysisResult, ImpedancePath, PathSegment } from './engine-types';

export function pathSegmentsOf(path: ImpedancePath): PathSegment[] {
  return path.segments;
}

export function pathStartOf(path: ImpedancePath): Complex | null {
  return path.load ?? null;
}

/** The impedance path of an analysed design (interim: straight steps between the centre-frequency stages). */
export function impedancePathOf(design: Design, result: AnalysisResult): ImpedancePath {
  const stages = result.stagesAtCenter;
  const kindOf = new Map(design.elements.map((e) => [e.id, e.kind]));
  const segments: PathSegment[] = [];
  for (let i = 1; i < stages.length; i++) {
    const a = stages[i - 1].z;
    const b = stages[i].z;
    segments.push({ elementId: stages[i].after, kind: kindOf.get(stages[i].after) ?? 'two-port', z: Float64Array.of(a[0], a[1], b[0], b[1]) });
  }
  return { load: stages[0]?.z ?? [design.referenceOhms, 0], segments };
}
