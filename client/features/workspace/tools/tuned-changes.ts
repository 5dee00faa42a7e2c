/**
 * What an optimiser changed: the fields of each element that differ between the chain as it is
 * and the refined chain, so applying the result touches only those (a collaborator's concurrent
 * edit to another element or field survives).
 */
import type { Element } from '../../../../shared/rf/design';
import { jsonEqual } from '../../../../shared/collab/describe';

export interface FieldChange {
  id: string;
  field: string;
  value: unknown;
}

/** Fields an optimiser never changes (identity, annotation, the lock itself). */
const FIXED = new Set(['id', 'kind', 'label', 'locked', 'tolerance']);

export function tunedFieldChanges(current: readonly Element[], refined: readonly Element[]): FieldChange[] {
  const byId = new Map(current.map((e) => [e.id, e as Record<string, unknown>]));
  const out: FieldChange[] = [];
  for (const r of refined) {
    const now = byId.get(r.id);
    if (!now || now.kind !== r.kind || now.locked === true) continue;
    for (const [field, value] of Object.entries(r)) {
      if (FIXED.has(field) || value === undefined) continue;
      if (!jsonEqual(now[field], value)) out.push({ id: r.id, field, value });
    }
  }
  return out;
}
