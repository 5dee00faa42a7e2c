// Per-user undo (shared/collab/undo.ts) on two documents that exchange updates directly: each person's
// undo reverts only their own edits, and remote edits are never on anyone's stack.
import { describe, expect, it } from 'vitest';
import * as Y from 'yjs';
import { createDesignDoc, insertElement, orderedElementIds, readElement, setElementField } from '../../shared/collab/schema';
import { createEditOrigin, createUserUndoManager } from '../../shared/collab/undo';
import { designWith } from './helpers/world';

const REMOTE = Symbol('remote');

function pair() {
  const a = createDesignDoc(designWith([{ id: 'c1', kind: 'shunt-c', value: 1e-12 }, { id: 'l1', kind: 'series-l', value: 1e-9 }]));
  const b = new Y.Doc();
  Y.applyUpdate(b, Y.encodeStateAsUpdate(a));
  a.on('update', (u: Uint8Array, origin: unknown) => origin !== REMOTE && Y.applyUpdate(b, u, REMOTE));
  b.on('update', (u: Uint8Array, origin: unknown) => origin !== REMOTE && Y.applyUpdate(a, u, REMOTE));
  return { a, b };
}

describe('createUserUndoManager', () => {
  it("undoes only its own person's edits", () => {
    const { a, b } = pair();
    const ea = createEditOrigin('ada');
    const eb = createEditOrigin('bo');
    const ua = createUserUndoManager(a, ea, { captureTimeoutMs: 0 });
    const ub = createUserUndoManager(b, eb, { captureTimeoutMs: 0 });
    setElementField(a, 'c1', 'value', 2e-12, ea);
    setElementField(b, 'l1', 'value', 2e-9, eb);
    insertElement(b, { id: 'r1', kind: 'shunt-r', value: 100 }, 0, eb);
    expect(ua.undoStack).toHaveLength(1);
    expect(ub.undoStack).toHaveLength(2);
    ua.undo();
    for (const d of [a, b]) {
      expect(readElement(d, 'c1')!.value).toBe(1e-12);
      expect(readElement(d, 'l1')!.value).toBe(2e-9);
      expect(orderedElementIds(d)).toEqual(['r1', 'c1', 'l1']);
    }
    ua.redo();
    expect(readElement(b, 'c1')!.value).toBe(2e-12);
    ub.undo();
    ub.undo();
    expect(orderedElementIds(a)).toEqual(['c1', 'l1']);
    expect(readElement(a, 'c1')!.value).toBe(2e-12);
    expect(readElement(a, 'l1')!.value).toBe(1e-9);
  });

  it('edits without the origin (remote or untracked) are not undoable', () => {
    const { a } = pair();
    const ua = createUserUndoManager(a, createEditOrigin('ada'));
    setElementField(a, 'c1', 'value', 5e-12);
    expect(ua.undoStack).toHaveLength(0);
    expect(ua.undo()).toBeNull();
    expect(readElement(a, 'c1')!.value).toBe(5e-12);
  });

  it('merges edits closer than the capture timeout into one step', () => {
    const { a } = pair();
    const ea = createEditOrigin('ada');
    const ua = createUserUndoManager(a, ea, { captureTimeoutMs: 10_000 });
    setElementField(a, 'c1', 'value', 2e-12, ea);
    setElementField(a, 'c1', 'value', 3e-12, ea);
    expect(ua.undoStack).toHaveLength(1);
    ua.undo();
    expect(readElement(a, 'c1')!.value).toBe(1e-12);
  });
});
