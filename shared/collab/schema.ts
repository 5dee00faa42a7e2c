/**
 * The shared room document (CONTRACT.md §4). This module is the only code that knows the document's
 * key strings; every reader and writer, in the browser and on the server, goes through it.
 *
 * Layout: root `Y.Map` "design" holds the design file's top-level fields as plain JSON values, and
 * "elements", a `Y.Map` from element id to a `Y.Map` of that element's fields plus "order", a
 * fractional-index string. The chain is the elements sorted by ascending order (ties broken by id, so
 * two peers that inserted at the same place at the same time still agree), load -> port.
 */
import * as Y from 'yjs';
import { generateKeyBetween } from 'fractional-indexing';
import { parseDesign, type Design, type DesignInput, type Element } from '../rf/design';

export const DESIGN_KEY = 'design';
export const ELEMENTS_KEY = 'elements';
export const ORDER_KEY = 'order';

/** Top-level fields of the design file kept as plain JSON values in the "design" map. */
export const DESIGN_FIELDS = ['name', 'referenceOhms', 'port', 'load', 'band', 'sweep', 'goal', 'drive', 'substrate'] as const;
export type DesignField = (typeof DESIGN_FIELDS)[number];

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

export function designMap(doc: Y.Doc): Y.Map<unknown> {
  return doc.getMap(DESIGN_KEY);
}

/** The elements map, created on first write. Returns undefined in a document that has none yet. */
function elementsMap(doc: Y.Doc): Y.Map<Y.Map<unknown>> | undefined {
  const m = designMap(doc).get(ELEMENTS_KEY);
  return m instanceof Y.Map ? (m as Y.Map<Y.Map<unknown>>) : undefined;
}

function ensureElementsMap(doc: Y.Doc): Y.Map<Y.Map<unknown>> {
  const existing = elementsMap(doc);
  if (existing) return existing;
  const m = new Y.Map<Y.Map<unknown>>();
  designMap(doc).set(ELEMENTS_KEY, m);
  return m;
}

/** Element ids in chain order (load -> port). */
export function orderedElementIds(doc: Y.Doc): string[] {
  const els = elementsMap(doc);
  if (!els) return [];
  const rows: { id: string; order: string }[] = [];
  els.forEach((m, id) => {
    const order = m.get(ORDER_KEY);
    rows.push({ id, order: typeof order === 'string' ? order : '' });
  });
  rows.sort((a, b) => (a.order < b.order ? -1 : a.order > b.order ? 1 : a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  return rows.map((r) => r.id);
}

function elementOrder(doc: Y.Doc, id: string): string | null {
  const o = elementsMap(doc)?.get(id)?.get(ORDER_KEY);
  return typeof o === 'string' ? o : null;
}

/** A fractional key strictly between the elements now at chain positions index-1 and index. */
function orderKeyAt(doc: Y.Doc, index: number, excludeId?: string): string {
  const ids = orderedElementIds(doc).filter((i) => i !== excludeId);
  const clamped = Math.max(0, Math.min(index, ids.length));
  const before = clamped > 0 ? elementOrder(doc, ids[clamped - 1]) : null;
  const after = clamped < ids.length ? elementOrder(doc, ids[clamped]) : null;
  // Equal neighbours (a concurrent insert at the same spot) cannot be split; step past the duplicate.
  if (before !== null && after !== null && before >= after) return generateKeyBetween(before, null);
  return generateKeyBetween(before, after);
}

function elementToYMap(element: Element, order: string): Y.Map<unknown> {
  const m = new Y.Map<unknown>();
  for (const [k, v] of Object.entries(element)) if (v !== undefined && k !== ORDER_KEY) m.set(k, v as Json);
  m.set(ORDER_KEY, order);
  return m;
}

/** The document as an unchecked design-file object (what a peer wrote; validate before use). */
export function readDesignInput(doc: Y.Doc): DesignInput {
  const d = designMap(doc);
  const out: Record<string, unknown> = { format: 'matchloom-design', version: 1 };
  for (const key of DESIGN_FIELDS) {
    const v = d.get(key);
    if (v !== undefined) out[key] = v;
  }
  const els = elementsMap(doc);
  out.elements = orderedElementIds(doc).map((id) => {
    const fields = els!.get(id)!.toJSON() as Record<string, unknown>;
    delete fields[ORDER_KEY];
    return { ...fields, id };
  });
  return out as DesignInput;
}

/** The document as a checked design file; throws `DesignError` naming the path if a peer wrote nonsense. */
export function readDesign(doc: Y.Doc): Design {
  return parseDesign(readDesignInput(doc));
}

/** One element's fields (unchecked), or undefined. */
export function readElement(doc: Y.Doc, id: string): Record<string, unknown> | undefined {
  const m = elementsMap(doc)?.get(id);
  if (!m) return undefined;
  const fields = m.toJSON() as Record<string, unknown>;
  delete fields[ORDER_KEY];
  return { ...fields, id };
}

/** Replace the whole document content with `design` (one transaction). */
export function writeDesign(doc: Y.Doc, design: Design | DesignInput, origin: unknown = null): void {
  doc.transact(() => {
    const d = designMap(doc);
    for (const key of DESIGN_FIELDS) {
      const v = (design as Record<string, unknown>)[key];
      if (v === undefined) d.delete(key);
      else d.set(key, v as Json);
    }
    const els = new Y.Map<Y.Map<unknown>>();
    let prev: string | null = null;
    for (const e of (design.elements ?? []) as Element[]) {
      prev = generateKeyBetween(prev, null);
      els.set(e.id, elementToYMap(e, prev));
    }
    d.set(ELEMENTS_KEY, els);
  }, origin);
}

/** A fresh document holding `design`. */
export function createDesignDoc(design: Design | DesignInput): Y.Doc {
  const doc = new Y.Doc();
  writeDesign(doc, design);
  return doc;
}

/** Set one top-level field (load, band, sweep, goal, ...). */
export function setDesignField(doc: Y.Doc, key: DesignField, value: unknown, origin: unknown = null): void {
  doc.transact(() => {
    if (value === undefined) designMap(doc).delete(key);
    else designMap(doc).set(key, value as Json);
  }, origin);
}

/** Set (or, with undefined, delete) one field of one element. The id and order are not fields. */
export function setElementField(doc: Y.Doc, id: string, field: string, value: unknown, origin: unknown = null): void {
  if (field === 'id' || field === ORDER_KEY) throw new Error(`"${field}" is not an editable element field`);
  doc.transact(() => {
    const m = elementsMap(doc)?.get(id);
    if (!m) return;
    if (value === undefined) m.delete(field);
    else m.set(field, value as Json);
  }, origin);
}

/** Insert an element at chain position `index` (0 = next to the load; default: at the port end). */
export function insertElement(doc: Y.Doc, element: Element, index?: number, origin: unknown = null): void {
  doc.transact(() => {
    const els = ensureElementsMap(doc);
    if (els.has(element.id)) throw new Error(`element id ${element.id} already exists`);
    const at = index ?? orderedElementIds(doc).length;
    els.set(element.id, elementToYMap(element, orderKeyAt(doc, at)));
  }, origin);
}

export function removeElement(doc: Y.Doc, id: string, origin: unknown = null): void {
  doc.transact(() => {
    elementsMap(doc)?.delete(id);
  }, origin);
}

/** Move an element to chain position `index` (counted without the element itself): changes one `order`. */
export function moveElement(doc: Y.Doc, id: string, index: number, origin: unknown = null): void {
  doc.transact(() => {
    const m = elementsMap(doc)?.get(id);
    if (!m) return;
    m.set(ORDER_KEY, orderKeyAt(doc, index, id));
  }, origin);
}

/** Replace the chain with `elements` in one transaction (applying a match-finder candidate, restoring). */
export function replaceElements(doc: Y.Doc, elements: readonly Element[], origin: unknown = null): void {
  doc.transact(() => {
    const els = ensureElementsMap(doc);
    for (const id of [...els.keys()]) els.delete(id);
    let prev: string | null = null;
    for (const e of elements) {
      prev = generateKeyBetween(prev, null);
      els.set(e.id, elementToYMap(e, prev));
    }
  }, origin);
}

/** The Yjs types that per-user undo should watch (the design map and everything below it). */
export function undoScope(doc: Y.Doc): Y.Map<unknown> {
  return designMap(doc);
}

/** Each element's fractional-index order key, by element id (for describing reorders). */
export function elementOrderKeys(doc: Y.Doc): Record<string, string> {
  const out: Record<string, string> = {};
  elementsMap(doc)?.forEach((m, id) => {
    const order = m instanceof Y.Map ? m.get(ORDER_KEY) : undefined;
    out[id] = typeof order === 'string' ? order : '';
  });
  return out;
}
