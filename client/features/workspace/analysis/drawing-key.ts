import type { Design } from '../../../../shared/rf/design';

/**
 * What of a design the chart and the plot depend on besides the analysis result: z0, band, goal
 * and the chain's length (for the spoken summary). A tuned element value changes the drawing only
 * once its result arrives, so memos keyed on this (not on the design object) skip redrawing the old
 * result on every edit.
 */
export function drawingKeyOf(design: Design | null): string {
  if (!design) return '';
  const b = design.band;
  return `${design.referenceOhms}|${b.startHz}|${b.stopHz}|${b.centerHz ?? ''}|${JSON.stringify(design.goal)}|${design.elements.length}`;
}

/** Props equal for drawing: every prop the same object, except `design`, compared by its drawing key. */
export function sameDrawingProps<P extends { design: Design | null }>(a: P, b: P): boolean {
  for (const k of Object.keys(a) as (keyof P)[]) if (k !== 'design' && a[k] !== b[k]) return false;
  for (const k of Object.keys(b) as (keyof P)[]) if (k !== 'design' && !(k in a)) return false;
  return a.design === b.design || drawingKeyOf(a.design) === drawingKeyOf(b.design);
}
