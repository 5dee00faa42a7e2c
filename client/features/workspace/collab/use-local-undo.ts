/**
 * Per-user undo on this screen: a Y.UndoManager (shared/collab/undo) that tracks only this user's
 * own edit origin, so Ctrl+Z never takes back a collaborator's edit. Every edit from the screen
 * goes through `edit` (a discrete change: its own undo step) or `tune` (a drag or wheel: steps
 * within a short pause merge into one).
 */
import { useEffect, useMemo, useState } from 'react';
import type * as Y from 'yjs';
import { createEditOrigin, createUserUndoManager, type EditOrigin } from '../../../../shared/collab/undo';

export interface LocalEditor {
  /** the transaction origin of this user's edits */
  origin: EditOrigin;
  edit(fn: (origin: EditOrigin) => void): void;
  tune(fn: (origin: EditOrigin) => void): void;
  undo(): void;
  redo(): void;
  canUndo: boolean;
  canRedo: boolean;
}

/** Continuous changes closer together than this merge into one undo step. */
export const TUNE_CAPTURE_MS = 700;

interface Setup {
  doc: Y.Doc;
  origin: EditOrigin;
  manager: Y.UndoManager;
}

export function useLocalUndo(doc: Y.Doc | null, userId: string | null): LocalEditor | null {
  const [setup, setSetup] = useState<Setup | null>(null);
  const [stacks, setStacks] = useState({ canUndo: false, canRedo: false });

  useEffect(() => {
    if (!doc || !userId) {
      setSetup(null);
      return;
    }
    const origin = createEditOrigin(userId);
    const manager = createUserUndoManager(doc, origin, { captureTimeoutMs: TUNE_CAPTURE_MS });
    const refresh = () => setStacks({ canUndo: manager.canUndo(), canRedo: manager.canRedo() });
    manager.on('stack-item-added', refresh);
    manager.on('stack-item-popped', refresh);
    manager.on('stack-cleared', refresh);
    setSetup({ doc, origin, manager });
    refresh();
    return () => {
      manager.off('stack-item-added', refresh);
      manager.off('stack-item-popped', refresh);
      manager.off('stack-cleared', refresh);
      manager.destroy();
    };
  }, [doc, userId]);

  return useMemo(() => {
    if (!setup) return null;
    const { doc: d, origin, manager } = setup;
    return {
      origin,
      edit(fn) {
        manager.stopCapturing();
        d.transact(() => fn(origin), origin);
        manager.stopCapturing();
      },
      tune(fn) {
        d.transact(() => fn(origin), origin);
      },
      undo: () => void manager.undo(),
      redo: () => void manager.redo(),
      canUndo: stacks.canUndo,
      canRedo: stacks.canRedo,
    };
  }, [setup, stacks]);
}
