/**
 * Durable storage of room documents: an append-only log of accepted Yjs updates per room
 * (`room_updates`) plus a compacted state (`room_states`, the merge of every update up to `upto_id`).
 * A document loads as the compacted state followed by the later updates. Persistence is passed in
 * (a Knex instance), never a module global.
 */
import * as Y from 'yjs';
import type { Knex } from 'knex';
import { createDesignDoc, readDesign } from '../../shared/collab/schema';
import { DesignError, type Design, type DesignInput } from '../../shared/rf/design';

export interface StoredDoc {
  doc: Y.Doc;
  /** id of the newest update applied (0 when none). */
  lastUpdateId: number;
  /** how many log rows lie past the compacted state. */
  pendingUpdates: number;
  /** log rows that could not be applied (damaged bytes) and were skipped. */
  skippedUpdates: number;
}

function toUint8(b: Buffer | Uint8Array): Uint8Array {
  return b instanceof Uint8Array ? new Uint8Array(b.buffer, b.byteOffset, b.byteLength) : b;
}

/** Append one accepted update to the room's log; returns its id. */
export async function appendUpdate(
  knex: Knex | Knex.Transaction,
  roomId: string,
  update: Uint8Array,
  userId: string | null,
): Promise<number> {
  const [row] = await knex('room_updates')
    .insert({ room_id: roomId, update: Buffer.from(update), user_id: userId, created_at: Date.now() })
    .returning('id');
  return typeof row === 'object' ? Number((row as { id: number }).id) : Number(row);
}

/**
 * Append several accepted updates in one statement (one SQLite transaction); returns their ids in the
 * same order.
 */
export async function appendUpdates(
  knex: Knex | Knex.Transaction,
  roomId: string,
  rows: readonly { update: Uint8Array; userId: string | null }[],
): Promise<number[]> {
  if (rows.length === 0) return [];
  const now = Date.now();
  const inserted = await knex('room_updates')
    .insert(rows.map((r) => ({ room_id: roomId, update: Buffer.from(r.update), user_id: r.userId, created_at: now })))
    .returning('id');
  return inserted.map((row) => (typeof row === 'object' ? Number((row as { id: number }).id) : Number(row)));
}

/** Store the first state of a new room's document. */
export async function createRoomDocument(knex: Knex | Knex.Transaction, roomId: string, design: Design | DesignInput): Promise<void> {
  const doc = createDesignDoc(design);
  await knex('room_states').insert({ room_id: roomId, state: Buffer.from(Y.encodeStateAsUpdate(doc)), upto_id: 0, updated_at: Date.now() });
  doc.destroy();
}

/** Load a room's document from the compacted state plus the later log. */
export async function loadRoomDocument(knex: Knex | Knex.Transaction, roomId: string): Promise<StoredDoc> {
  const doc = new Y.Doc({ gc: true });
  const state = await knex('room_states').where({ room_id: roomId }).first();
  const upto = state ? Number(state.upto_id) : 0;
  if (state) Y.applyUpdate(doc, toUint8(state.state));
  const rows = await knex('room_updates').where({ room_id: roomId }).andWhere('id', '>', upto).orderBy('id', 'asc').select('id', 'update');
  let last = upto;
  let skipped = 0;
  for (const r of rows) {
    try {
      Y.applyUpdate(doc, toUint8(r.update));
    } catch {
      skipped++; // damaged bytes: the rest of the log still loads
    }
    last = Number(r.id);
  }
  return { doc, lastUpdateId: last, pendingUpdates: rows.length, skippedUpdates: skipped };
}

/**
 * Merge the log into the compacted state, in one transaction: the state now covers every update up to
 * `uptoId` and those rows are deleted. Safe to run while new updates arrive (they have larger ids).
 */
export async function compactRoomDocument(knex: Knex, roomId: string): Promise<void> {
  await knex.transaction(async (trx) => {
    const { doc, lastUpdateId } = await loadRoomDocument(trx, roomId);
    const state = Buffer.from(Y.encodeStateAsUpdate(doc));
    doc.destroy();
    const exists = await trx('room_states').where({ room_id: roomId }).first('room_id');
    if (exists) await trx('room_states').where({ room_id: roomId }).update({ state, upto_id: lastUpdateId, updated_at: Date.now() });
    else await trx('room_states').insert({ room_id: roomId, state, upto_id: lastUpdateId, updated_at: Date.now() });
    await trx('room_updates').where({ room_id: roomId }).andWhere('id', '<=', lastUpdateId).delete();
  });
}

/**
 * Write an in-memory document as the room's compacted state covering every log row up to `uptoId`, and
 * delete those rows, in one transaction. The caller guarantees that `state` is exactly the merge of the
 * stored state and rows up to `uptoId` (the room socket compacts between writes, in its write queue).
 */
export async function saveRoomState(knex: Knex, roomId: string, state: Uint8Array, uptoId: number): Promise<void> {
  await knex.transaction(async (trx) => {
    const row = { state: Buffer.from(state), upto_id: uptoId, updated_at: Date.now() };
    const exists = await trx('room_states').where({ room_id: roomId }).first('room_id');
    if (exists) await trx('room_states').where({ room_id: roomId }).update(row);
    else await trx('room_states').insert({ room_id: roomId, ...row });
    await trx('room_updates').where({ room_id: roomId }).andWhere('id', '<=', uptoId).delete();
  });
}

/**
 * The design file of a room as stored (every accepted update is stored before it is broadcast).
 * Throws `DesignError` when the stored document is not a valid design (a peer wrote nonsense).
 */
export async function loadRoomDesign(knex: Knex, roomId: string): Promise<Design> {
  const { doc } = await loadRoomDocument(knex, roomId);
  try {
    return readDesign(doc);
  } catch (e) {
    if (e instanceof DesignError) throw e;
    throw new DesignError('', `the room document is not shaped like a design (${(e as Error).message})`);
  } finally {
    doc.destroy();
  }
}
