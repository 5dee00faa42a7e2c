/**
 * The differences between two design files, for comparing snapshots, branches and the live room:
 * top-level fields that differ, elements added and removed (matched by id), elements whose fields
 * changed (old and new value per field) and elements whose place in the chain moved. Pure: no I/O.
 *
 * Nested objects are compared field by field and named by a dotted path (`band.startHz`,
 * `length.degrees`, `load.r`); arrays (a complex `[re, im]`, a table of points) are compared whole. In
 * a `FieldChange`, a missing `old` means the field is absent in `a`, a missing `new` that it is absent
 * in `b` (JSON leaves `undefined` out, so the client sees the key missing). Within each object, `kind`
 * comes first and the other fields follow in alphabetical order.
 */
import type { Design, Element } from '../rf/design';

export interface FieldChange {
  /** Dotted path inside the design (`load.l`) or inside the element (`value`, `length.degrees`). */
  path: string;
  old?: unknown;
  new?: unknown;
}

export interface PlacedElement {
  id: string;
  /** Position in its chain, 0 = next to the load. */
  index: number;
  element: Element;
}

export interface ElementChange {
  id: string;
  /** The element's kind in `b` (a kind change also shows as a `kind` field change). */
  kind: string;
  changes: FieldChange[];
}

export interface ElementMove {
  id: string;
  fromIndex: number;
  toIndex: number;
}

export interface DesignDiff {
  /** Top-level fields (`name`, `load.*`, `band.*`, `sweep.*`, `goal.*`, `port.*`, `drive.*`, `substrate.*`, `referenceOhms`). */
  fields: FieldChange[];
  /** In `b` only. */
  added: PlacedElement[];
  /** In `a` only. */
  removed: PlacedElement[];
  /** In both, with different field values (chain order as in `b`). */
  changed: ElementChange[];
  /** In both, but in a different order relative to the other shared elements. */
  moved: ElementMove[];
  /** true when nothing differs. */
  identical: boolean;
}

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** Structural equality of JSON-like values (object key order does not matter). */
export function jsonEqual(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (Array.isArray(a) || Array.isArray(b)) {
    if (!Array.isArray(a) || !Array.isArray(b) || a.length !== b.length) return false;
    return a.every((v, i) => jsonEqual(v, b[i]));
  }
  if (isPlainObject(a) && isPlainObject(b)) {
    const ka = Object.keys(a).filter((k) => a[k] !== undefined);
    const kb = Object.keys(b).filter((k) => b[k] !== undefined);
    if (ka.length !== kb.length) return false;
    return ka.every((k) => jsonEqual(a[k], b[k]));
  }
  return Number.isNaN(a) && Number.isNaN(b);
}

/** `kind` first (it says what the other fields mean), then alphabetical. */
function byKindThenName(x: string, y: string): number {
  if (x === y) return 0;
  if (x === 'kind') return -1;
  if (y === 'kind') return 1;
  return x < y ? -1 : 1;
}

/** Field-by-field changes between two values, nested objects flattened to dotted paths. */
export function fieldChanges(a: unknown, b: unknown, prefix = ''): FieldChange[] {
  if (isPlainObject(a) && isPlainObject(b)) {
    const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])].sort(byKindThenName);
    return keys.flatMap((k) => fieldChanges(a[k], b[k], prefix ? `${prefix}.${k}` : k));
  }
  if (jsonEqual(a, b)) return [];
  const change: FieldChange = { path: prefix };
  if (a !== undefined) change.old = a as Json;
  if (b !== undefined) change.new = b as Json;
  return [change];
}

/** Indices (into `seq`) of one longest strictly increasing subsequence (patience sorting). */
function longestIncreasing(seq: readonly number[]): Set<number> {
  const tails: number[] = []; // tails[k] = index into seq of the smallest tail of a run of length k+1
  const prev = new Array<number>(seq.length).fill(-1);
  for (let i = 0; i < seq.length; i++) {
    let lo = 0;
    let hi = tails.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (seq[tails[mid]] < seq[i]) lo = mid + 1;
      else hi = mid;
    }
    if (lo > 0) prev[i] = tails[lo - 1];
    tails[lo] = i;
  }
  const keep = new Set<number>();
  for (let i = tails.length ? tails[tails.length - 1] : -1; i >= 0; i = prev[i]) keep.add(i);
  return keep;
}

const TOP_LEVEL_SKIPPED = new Set(['format', 'version', 'elements']);

function topLevel(d: Design): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(d)) if (!TOP_LEVEL_SKIPPED.has(k)) out[k] = v;
  return out;
}

function withoutId(e: Element): Record<string, unknown> {
  const rest: Record<string, unknown> = { ...e };
  delete rest.id;
  return rest;
}

/** What changed going from design `a` to design `b`. */
export function designDiff(a: Design, b: Design): DesignDiff {
  const fields = fieldChanges(topLevel(a), topLevel(b));

  const aIndex = new Map(a.elements.map((e, i) => [e.id, i]));
  const bIndex = new Map(b.elements.map((e, i) => [e.id, i]));
  const removed = a.elements.flatMap((e, index) =>
    bIndex.has(e.id) ? [] : [{ id: e.id, index, element: e }],
  );
  const added = b.elements.flatMap((e, index) => (aIndex.has(e.id) ? [] : [{ id: e.id, index, element: e }]));

  const changed: ElementChange[] = [];
  for (const e of b.elements) {
    const before = aIndex.has(e.id) ? a.elements[aIndex.get(e.id)!] : undefined;
    if (!before) continue;
    const changes = fieldChanges(withoutId(before), withoutId(e));
    if (changes.length > 0) changed.push({ id: e.id, kind: e.kind, changes });
  }

  // Shared elements in b's order, numbered by their place in a: those off the longest increasing run moved.
  const shared = b.elements.filter((e) => aIndex.has(e.id));
  const keep = longestIncreasing(shared.map((e) => aIndex.get(e.id)!));
  const moved = shared.flatMap((e, i) =>
    keep.has(i) ? [] : [{ id: e.id, fromIndex: aIndex.get(e.id)!, toIndex: bIndex.get(e.id)! }],
  );

  const identical =
    fields.length === 0 &&
    added.length === 0 &&
    removed.length === 0 &&
    changed.length === 0 &&
    moved.length === 0;
  return { fields, added, removed, changed, moved, identical };
}
