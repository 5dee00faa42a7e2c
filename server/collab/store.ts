/**
 * Durable storage of room documents: an append-only log of accepted Yjs updates per room
 * (`room_updates`) plus a compacted state (`room_states`, the merge of every update up to `upto_id`).
 * A document loads as the compacted state followed by the later updates. Persistence is passed in
 * (a Knex instance), never a module global.
 */
import * as Y from 'yjs';
import { createRequire } from 'node:module';
import { Worker } from 'node:worker_threads';
import Database from 'better-sqlite3';
import type { Knex } from 'knex';
import { createDesignDoc, readDesign } from '../../shared/collab/schema';
import { checkpointOnThread, isPostgres } from '../db';
import { DesignError, type Design, type DesignInput } from '../../shared/rf/design';

export interface StoredDoc {
  doc: Y.Doc;
  /** id of the newest update applied (0 when none). */
  lastUpdateId: number;
  /** how many log rows lie past the compacted state. */
  pendingUpdates: number;
  /** log rows that could not be applied (damaged bytes) and were skipped. */
  skippedUpdates: number;
  /** the ids of the log rows read. */
  ids: number[];
  /** which compacted state was read (`stateMarkOf`; '' for none). */
  stateMark: string;
}

/** Identifies one version of a room's compacted state: a compaction changes it. */
export function stateMarkOf(row: { upto_id: unknown; updated_at: unknown }): string {
  return `${Number(row.upto_id)}:${Number(row.updated_at)}`;
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
  const { state, rows } = await readStateAndLog(knex, roomId);
  const doc = new Y.Doc({ gc: true });
  const upto = state ? Number(state.upto_id) : 0;
  if (state) Y.applyUpdate(doc, toUint8(state.state));
  let last = upto;
  let skipped = 0;
  const ids: number[] = [];
  for (const r of rows) {
    try {
      Y.applyUpdate(doc, toUint8(r.update));
    } catch {
      skipped++; // damaged bytes: the rest of the log still loads
    }
    ids.push(Number(r.id));
    last = Math.max(last, Number(r.id));
  }
  return { doc, lastUpdateId: last, pendingUpdates: rows.length, skippedUpdates: skipped, ids, stateMark: state ? stateMarkOf(state) : '' };
}

/** Times a load reads again when a compaction committed between its reads. */
const LOAD_ATTEMPTS = 5;

/**
 * The compacted state and every row still in the log, as of one moment. Not only the rows past `upto_id`:
 * compaction deletes exactly the rows it merged, and on PostgreSQL a row may commit after a row with a
 * larger id (two processes writing). The two reads are separate statements, so a compaction (state
 * rewritten, merged rows deleted) committing between them would leave this load with the old state and
 * without the merged rows; the state's mark is read again after the rows, and on a change both are read
 * again. (A transaction would pin one snapshot, but on SQLite ours begin IMMEDIATE, taking the write lock
 * that the room writer never waits for.)
 */
async function readStateAndLog(knex: Knex | Knex.Transaction, roomId: string) {
  for (let attempt = 1; ; attempt++) {
    const state = await knex('room_states').where({ room_id: roomId }).first();
    const rows = await knex('room_updates').where({ room_id: roomId }).orderBy('id', 'asc').select('id', 'update');
    const after = await knex('room_states').where({ room_id: roomId }).first('upto_id', 'updated_at');
    const same = state && after ? stateMarkOf(state) === stateMarkOf(after) : !state && !after;
    if (same || attempt >= LOAD_ATTEMPTS) return { state, rows };
  }
}

/**
 * Merge the log into the compacted state, in one transaction: the state now covers every update up to
 * `uptoId` and those rows are deleted. Safe to run while new updates arrive (they have larger ids).
 */
export async function compactRoomDocument(knex: Knex, roomId: string): Promise<void> {
  await knex.transaction(async (trx) => {
    // Two processes compacting the same room one after the other, not interleaved (SQLite's write
    // transactions are serial already).
    if (isPostgres(knex)) await trx('room_states').where({ room_id: roomId }).forUpdate().first('room_id');
    const { doc, lastUpdateId, ids } = await loadRoomDocument(trx, roomId);
    const state = Buffer.from(Y.encodeStateAsUpdate(doc));
    doc.destroy();
    const exists = await trx('room_states').where({ room_id: roomId }).first('room_id');
    if (exists) await trx('room_states').where({ room_id: roomId }).update({ state, upto_id: lastUpdateId, updated_at: Date.now() });
    else await trx('room_states').insert({ room_id: roomId, state, upto_id: lastUpdateId, updated_at: Date.now() });
    // Exactly the rows merged: one that another process has not committed yet stays for the next time.
    for (let i = 0; i < ids.length; i += 500) await trx('room_updates').whereIn('id', ids.slice(i, i + 500)).delete();
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

/**
 * A synchronous writer for the room log, on its own connection to the same SQLite file. The room socket
 * appends an update and applies it in the same turn of the event loop, with no pool and no awaits in
 * between (at a busy moment the async Knex path costs milliseconds per update). It never waits for a
 * lock: while another connection holds the write lock (a Knex transaction, which may be waiting on this
 * very thread), `append` returns null and the caller takes the async path instead.
 */
export interface SyncUpdateWriter {
  /** Append rows in one transaction; their ids in order, or null if the database is busy. */
  append(roomId: string, rows: readonly { update: Uint8Array; userId: string | null }[]): number[] | null;
  /** Several rooms' rows in one transaction; ids per room, or null if the database is busy. */
  appendMany(batches: readonly { roomId: string; rows: readonly { update: Uint8Array; userId: string | null }[] }[]): number[][] | null;
  /** `saveRoomState`, synchronously; false if the database is busy. */
  saveState(roomId: string, state: Uint8Array, uptoId: number): boolean;
  /** Insert a room log row; its id, or null if the database is busy. */
  insertLog(roomId: string, userId: string | null, message: string, at: number): number | null;
  /** Reword a room log row; false if the database is busy. */
  updateLog(id: number, message: string, at: number): boolean;
  close(): void;
}

/** A synchronous writer when `knex` is better-sqlite3 on a file; null otherwise (other databases, `:memory:`). */
export function openSyncUpdateWriter(knex: Knex): SyncUpdateWriter | null {
  const cfg = (knex as unknown as { client?: { config?: { client?: unknown; connection?: { filename?: unknown } } } }).client?.config;
  const filename = cfg?.connection?.filename;
  if (cfg?.client !== 'better-sqlite3' || typeof filename !== 'string' || filename === ':memory:' || filename === '') return null;
  const db = new Database(filename);
  db.pragma('journal_mode = WAL');
  db.pragma('synchronous = NORMAL'); // as the main connection: durable when the process dies
  db.pragma('foreign_keys = ON');
  db.pragma('busy_timeout = 0'); // never block the event loop on a lock
  // Checkpoints (the fsyncs) run on a thread of their own, so this connection's commits never wait on the disk.
  db.pragma('wal_autocheckpoint = 0');
  // Commits on this connection since start, for the checkpoint thread to pace itself by.
  const commits = new Int32Array(new SharedArrayBuffer(4));
  const checkpointer = startCheckpointer(filename, commits);
  // The only checkpoints: the pooled Knex connections' automatic ones would fsync on the event loop.
  const ownCheckpoints = checkpointOnThread(knex, filename);
  // Prepared on first use: the hub may be created before the migrations have run.
  let statements: ReturnType<typeof prepare> | null = null;
  function prepare() {
    const insert = db.prepare('insert into room_updates (room_id, "update", user_id, created_at) values (?, ?, ?, ?)');
    const hasState = db.prepare('select 1 from room_states where room_id = ?');
    const updateState = db.prepare('update room_states set state = ?, upto_id = ?, updated_at = ? where room_id = ?');
    const insertState = db.prepare('insert into room_states (room_id, state, upto_id, updated_at) values (?, ?, ?, ?)');
    const deleteUpto = db.prepare('delete from room_updates where room_id = ? and id <= ?');
    const insertLog = db.prepare('insert into room_log (room_id, user_id, message, created_at) values (?, ?, ?, ?)');
    const updateLog = db.prepare('update room_log set message = ?, created_at = ? where id = ?');
    return {
      insertLog,
      updateLog,
      appendMany: db.transaction((batches: readonly { roomId: string; rows: readonly { update: Uint8Array; userId: string | null }[] }[]) => {
        const now = Date.now();
        return batches.map((b) => b.rows.map((r) => Number(insert.run(b.roomId, blob(r.update), r.userId, now).lastInsertRowid)));
      }),
      insert,
      save: db.transaction((roomId: string, state: Uint8Array, uptoId: number) => {
        const now = Date.now();
        if (hasState.get(roomId)) updateState.run(Buffer.from(state), uptoId, now, roomId);
        else insertState.run(roomId, Buffer.from(state), uptoId, now);
        deleteUpto.run(roomId, uptoId);
      }),
    };
  }
  const st = () => (statements ??= prepare());
  const busy = (e: unknown) => (e as { code?: string }).code === 'SQLITE_BUSY' || (e as { code?: string }).code === 'SQLITE_LOCKED';
  /** `write()`, or `whenBusy` if another connection holds the write lock (never waits for it). */
  function unlessBusy<T>(write: () => T, whenBusy: T): T {
    try {
      const out = write();
      Atomics.add(commits, 0, 1);
      return out;
    } catch (e) {
      if (busy(e)) return whenBusy;
      throw e;
    }
  }
  return {
    append(roomId, rows) {
      return this.appendMany([{ roomId, rows }])?.[0] ?? null;
    },
    appendMany(batches) {
      return unlessBusy(() => {
        // One row (the usual case: one update per turn) needs no explicit transaction: the insert's own
        // autocommit is atomic.
        if (batches.length === 1 && batches[0].rows.length === 1) {
          const { roomId, rows } = batches[0];
          return [[Number(st().insert.run(roomId, blob(rows[0].update), rows[0].userId, Date.now()).lastInsertRowid)]];
        }
        return st().appendMany.immediate(batches);
      }, null);
    },
    saveState(roomId, state, uptoId) {
      return unlessBusy(() => {
        st().save.immediate(roomId, state, uptoId);
        return true;
      }, false);
    },
    insertLog(roomId, userId, message, at) {
      return unlessBusy(() => Number(st().insertLog.run(roomId, userId, message, at).lastInsertRowid), null);
    },
    updateLog(id, message, at) {
      return unlessBusy(() => {
        st().updateLog.run(message, at, id);
        return true;
      }, false);
    },
    close() {
      void checkpointer.terminate();
      ownCheckpoints();
      if (db.open) db.close();
    },
  };
}

/** The bytes as a Buffer over the same memory (better-sqlite3 binds only Buffers as blobs; no copy). */
function blob(u: Uint8Array): Buffer {
  return Buffer.isBuffer(u) ? u : Buffer.from(u.buffer, u.byteOffset, u.byteLength);
}

/**
 * WAL checkpoints run on a thread of their own, paced by the room writer's commits: every
 * CHECKPOINT_POLL_MS the thread checkpoints if at least CHECKPOINT_MIN_COMMITS commits have been made
 * since its last checkpoint, or if CHECKPOINT_MAX_MS have passed. A checkpoint's fsync makes the
 * writer's appends meanwhile slower (measured: insert p95 0.2 ms → 0.7–0.9 ms, p99 up to 12 ms with a
 * checkpoint every second at 10 edits/s), so a quiet room checkpoints every 30 s, not every second,
 * while a busy server still checkpoints about once a second (the WAL stays a few MB).
 */
export const CHECKPOINT_POLL_MS = 1000;
export const CHECKPOINT_MIN_COMMITS = 250;
export const CHECKPOINT_MAX_MS = 30_000;

const CHECKPOINTER = `
const { workerData } = require('node:worker_threads');
const Database = require(workerData.module);
const db = new Database(workerData.file);
db.pragma('busy_timeout = 1000');
let seen = 0;
let last = Date.now();
setInterval(() => {
  const n = Atomics.load(workerData.commits, 0);
  if (n - seen < workerData.minCommits && Date.now() - last < workerData.maxMs) return;
  try {
    db.pragma('wal_checkpoint(PASSIVE)');
    seen = n;
    last = Date.now();
  } catch { /* busy or gone: next time */ }
}, workerData.pollMs);
`;

/** The checkpoint thread for `file` (PASSIVE checkpoints: they never block writers). */
function startCheckpointer(file: string, commits: Int32Array): Worker {
  const worker = new Worker(CHECKPOINTER, {
    eval: true,
    workerData: {
      file,
      commits,
      module: createRequire(import.meta.url).resolve('better-sqlite3'),
      pollMs: CHECKPOINT_POLL_MS,
      minCommits: CHECKPOINT_MIN_COMMITS,
      maxMs: CHECKPOINT_MAX_MS,
    },
  });
  worker.on('error', () => {}); // a failed checkpointer only means the main connections checkpoint instead
  worker.unref();
  return worker;
}
