/**
 * Per-user undo. Each person's undo stack holds only the edits they made on this screen: the manager
 * tracks one origin, the object passed as `origin` to every schema.ts writer (setElementField,
 * moveElement, ...) for that person's edits. Remote edits arrive with the provider as origin and are
 * never undone by someone else's Ctrl+Z.
 *
 *   const origin = createEditOrigin(me.id);
 *   const undo = createUserUndoManager(doc, origin);
 *   setElementField(doc, 'c2', 'value', 1.5e-12, origin);
 *   undo.undo();
 */
import * as Y from 'yjs';
import { undoScope } from './schema';

/** The origin object of one person's local edits (compared by identity, so create it once). */
export interface EditOrigin {
  readonly kind: 'local-edit';
  readonly userId: string;
}

export function createEditOrigin(userId: string): EditOrigin {
  return Object.freeze({ kind: 'local-edit', userId });
}

export interface UserUndoOptions {
  /** Edits closer together than this merge into one undo step (ms; default 500, 0 = every edit its own step). */
  captureTimeoutMs?: number;
}

/** A `Y.UndoManager` over the whole design that undoes and redoes only `origin`'s edits. */
export function createUserUndoManager(doc: Y.Doc, origin: EditOrigin, opts: UserUndoOptions = {}): Y.UndoManager {
  return new Y.UndoManager(undoScope(doc), {
    trackedOrigins: new Set<unknown>([origin]),
    captureTimeout: opts.captureTimeoutMs ?? 500,
  });
}
