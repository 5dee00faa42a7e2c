/**
 * Element ids like L1, C2, TL1: the kind's prefix (the match finder's, shared/rf/match-ids) and
 * the next number not yet used with that prefix in the room document. Numbers are not reused
 * while a higher one exists, so an id in the room log keeps pointing at one part.
 */
import type { ElementKind } from '../../../../shared/rf/design';
import { elementIdPrefix } from '../../../../shared/rf/match-ids';

/** The next free id for `kind` given the ids (and labels) already in the document. */
export function allocateElementId(kind: ElementKind, existingIds: Iterable<string>): string {
  const prefix = elementIdPrefix(kind);
  const taken = new Set(existingIds);
  const pattern = new RegExp(`^${prefix}(\\d+)$`);
  let highest = 0;
  for (const id of taken) {
    const m = pattern.exec(id);
    if (m) highest = Math.max(highest, Number(m[1]));
  }
  let n = highest + 1;
  while (taken.has(`${prefix}${n}`)) n++;
  return `${prefix}${n}`;
}
