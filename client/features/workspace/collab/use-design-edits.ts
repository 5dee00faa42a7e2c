/**
 * Every change the room screen makes to the design, each one transaction with this user's origin
 * (so collaborators see it at once and only this user's undo takes it back). All of them do
 * nothing when the user may not edit: the server drops an observer's updates anyway.
 */
import { useMemo } from 'react';
import type * as Y from 'yjs';
import {
  insertElement,
  moveElement,
  orderedElementIds,
  readDesignInput,
  readElement,
  removeElement,
  replaceElements,
  setDesignField,
  setElementField,
} from '../../../../shared/collab/schema';
import { safeParseDesign, type Design, type Element, type ElementKind } from '../../../../shared/rf/design';
import { defaultElement } from '../chain/element-defaults';
import { allocateElementName } from '../chain/element-ids';
import type { DesignPatch } from '../forms/design-patch';
import type { FieldChange } from '../tools/tuned-changes';
import type { LocalEditor } from './use-local-undo';

export interface DesignEdits {
  /** adds a new element of `kind` at chain index `index` (default: the port end); returns its id */
  add(kind: ElementKind, index?: number): string | null;
  remove(id: string): void;
  /** a copy with a fresh id next to the original (port side); returns the new id */
  duplicate(id: string): string | null;
  move(id: string, index: number): void;
  setField(id: string, field: string, value: unknown): void;
  setFields(id: string, fields: Record<string, unknown>): void;
  tuneField(id: string, field: string, value: unknown): void;
  /** writes top-level fields in one edit; returns why not when the design would be invalid */
  applyPatch(patch: DesignPatch): string | null;
  replaceChain(elements: readonly Element[]): void;
  applyChanges(changes: readonly FieldChange[]): void;
}

/** The design the document would hold with `patch` applied, checked; or the reason it is not valid. */
export function patchedDesign(doc: Y.Doc, patch: DesignPatch): { ok: true; design: Design } | { ok: false; message: string } {
  const input: Record<string, unknown> = { ...readDesignInput(doc) };
  for (const [k, v] of Object.entries(patch)) {
    if (v === undefined) delete input[k];
    else input[k] = v;
  }
  const checked = safeParseDesign(input);
  return checked.ok ? { ok: true, design: checked.design } : { ok: false, message: checked.error.message };
}

/** Ids and labels in use: a new id must not read like another element's name either. */
function takenNames(elements: readonly Element[]): string[] {
  return elements.flatMap((e) => (e.label ? [e.id, e.label] : [e.id]));
}

export function useDesignEdits(doc: Y.Doc | null, editor: LocalEditor | null, editable: boolean): DesignEdits {
  return useMemo(() => {
    const can = (): [Y.Doc, LocalEditor] | null => (doc && editor && editable ? [doc, editor] : null);
    return {
      add(kind, index) {
        const ok = can();
        if (!ok) return null;
        const [d, ed] = ok;
        const current = safeParseDesign(readDesignInput(d));
        if (!current.ok) return null;
        const { id, label } = allocateElementName(kind, takenNames(current.design.elements));
        ed.edit((o) => insertElement(d, { ...defaultElement(kind, id, current.design), label }, index, o));
        return id;
      },
      remove(id) {
        const ok = can();
        if (ok) ok[1].edit((o) => removeElement(ok[0], id, o));
      },
      duplicate(id) {
        const ok = can();
        if (!ok) return null;
        const [d, ed] = ok;
        const fields = readElement(d, id);
        if (!fields) return null;
        const ids = orderedElementIds(d);
        const taken = ids.flatMap((i) => [i, String(readElement(d, i)?.label ?? '')]);
        const { id: copyId, label } = allocateElementName(fields.kind as ElementKind, taken);
        const copy = { ...fields, id: copyId, label } as Element;
        ed.edit((o) => insertElement(d, copy, ids.indexOf(id) + 1, o));
        return copyId;
      },
      move(id, index) {
        const ok = can();
        if (ok) ok[1].edit((o) => moveElement(ok[0], id, index, o));
      },
      setField(id, field, value) {
        const ok = can();
        if (ok) ok[1].edit((o) => setElementField(ok[0], id, field, value, o));
      },
      setFields(id, fields) {
        const ok = can();
        if (ok) ok[1].edit((o) => Object.entries(fields).forEach(([f, v]) => setElementField(ok[0], id, f, v, o)));
      },
      tuneField(id, field, value) {
        const ok = can();
        if (ok) ok[1].tune((o) => setElementField(ok[0], id, field, value, o));
      },
      applyPatch(patch) {
        const ok = can();
        if (!ok) return 'You are watching this room: only owners and tuners change the design.';
        const [d, ed] = ok;
        const checked = patchedDesign(d, patch);
        if (!checked.ok) return checked.message;
        ed.edit((o) => Object.entries(patch).forEach(([k, v]) => setDesignField(d, k as keyof DesignPatch, v, o)));
        return null;
      },
      replaceChain(elements) {
        const ok = can();
        if (ok) ok[1].edit((o) => replaceElements(ok[0], elements, o));
      },
      applyChanges(changes) {
        const ok = can();
        if (ok) ok[1].edit((o) => changes.forEach((c) => setElementField(ok[0], c.id, c.field, c.value, o)));
      },
    };
  }, [doc, editor, editable]);
}
