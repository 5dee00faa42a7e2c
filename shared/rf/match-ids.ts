/**
 * Readable element ids for finder candidates: C1, C2, L1, R1, TL1 (line), ST1 (stub), T1
 * (transformer), numbered along the chain from the load, never reusing an id already in the chain.
 */
import type { Element } from './design';
import type { ElementDraft } from './match-steps';

/** The id prefix of an element kind. */
export function elementIdPrefix(kind: Element['kind']): string {
  switch (kind) {
    case 'series-l':
    case 'shunt-l':
      return 'L';
    case 'series-c':
    case 'shunt-c':
      return 'C';
    case 'series-r':
    case 'shunt-r':
      return 'R';
    case 'line':
      return 'TL';
    case 'open-stub':
    case 'short-stub':
      return 'ST';
    case 'transformer':
      return 'T';
    default:
      return 'N';
  }
}

/** `kept` elements unchanged, then `drafts` with fresh ids and labels (id = label, e.g. "C1"). */
export function elementsNamed(kept: readonly Element[], drafts: readonly ElementDraft[]): Element[] {
  const taken = new Set(kept.map((e) => e.id));
  const next = new Map<string, number>();
  const out: Element[] = [...kept];
  for (const d of drafts) {
    const prefix = elementIdPrefix(d.kind);
    let n = next.get(prefix) ?? 1;
    while (taken.has(`${prefix}${n}`)) n++;
    const id = `${prefix}${n}`;
    next.set(prefix, n + 1);
    taken.add(id);
    out.push({ id, label: id, ...d } as Element);
  }
  return out;
}
