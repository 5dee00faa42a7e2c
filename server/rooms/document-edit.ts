/**
 * Server-side edits of a room's shared document (restoring a snapshot, putting an upload into the
 * design). The room document may be live on the collab hub, so an edit is never written around it:
 * the edit runs on a copy loaded from the store, its Yjs update is captured, and a `RoomUpdateSink`
 * stores it and applies it to the live document, so every open client sees one change.
 */
import * as Y from 'yjs';
import type { Knex } from 'knex';
import { loadRoomDocument } from '../collab/store';

export interface RoomUpdateSink {
  /** Store `update` in the room's log and apply it to the live document (broadcast to open sockets). */
  applyUpdate(roomId: string, update: Uint8Array, userId: string | null): Promise<void>;
}

/** The origin of server-side edits on the working copy. */
export const SERVER_EDIT = Symbol('matchloom-server-edit');

/**
 * Run `edit` on a copy of the room document (as stored) in one Yjs transaction and hand the resulting
 * update to `sink`. `edit` may read the copy first and return what the caller needs; it may throw
 * (an HttpError, say) before writing, and then nothing is sent. An edit that changes nothing sends
 * nothing (`changed: false`).
 */
export async function editRoomDocument<T>(
  deps: { knex: Knex; sink: RoomUpdateSink },
  roomId: string,
  userId: string,
  edit: (doc: Y.Doc) => T,
): Promise<{ result: T; changed: boolean }> {
  const { doc } = await loadRoomDocument(deps.knex, roomId);
  const updates: Uint8Array[] = [];
  const onUpdate = (u: Uint8Array) => updates.push(u);
  try {
    doc.on('update', onUpdate);
    let result!: T;
    doc.transact(() => {
      result = edit(doc);
    }, SERVER_EDIT);
    doc.off('update', onUpdate);
    if (updates.length === 0) return { result, changed: false };
    await deps.sink.applyUpdate(roomId, updates.length === 1 ? updates[0] : Y.mergeUpdates(updates), userId);
    return { result, changed: true };
  } finally {
    doc.destroy();
  }
}

/** True when the stored room document already holds everything in `update`. */
export async function storeHasUpdate(knex: Knex, roomId: string, update: Uint8Array): Promise<boolean> {
  const { doc } = await loadRoomDocument(knex, roomId);
  let changed = false;
  doc.on('update', () => (changed = true));
  try {
    Y.applyUpdate(doc, update);
    return !changed;
  } finally {
    doc.destroy();
  }
}
