/**
 * One loaded room: its Yjs document, the sockets in it and their awareness (cursor/selection presence),
 * and the write path. Every document update from a member who may edit goes through one queue per
 * room: checked, appended to `room_updates` (awaited), then relayed to the other sockets and applied, in
 * arrival order.
 * Observers' reads are answered; their writes are dropped. The log is compacted into `room_states`
 * every `compactEvery` accepted updates and when the room unloads.
 */
import * as Y from 'yjs';
import type { Knex } from 'knex';
import type { Logger } from 'pino';
import * as awarenessProtocol from 'y-protocols/awareness';
import { appendUpdates, compactRoomDocument, loadRoomDocument, saveRoomState, stateMarkOf, type SyncUpdateWriter } from './store';
import type { Cluster, RoomMessageKind } from './cluster';
import type { CollabConnection } from './connection';
import { formatBytes, type CollabLimits } from './limits';
import { backgroundQueue } from './yielding-queue';
import {
  awarenessMessage,
  decodeDocumentUpdate,
  parseAwarenessUpdate,
  parseClientMessage,
  ProtocolError,
  syncStep1Message,
  syncStep2Message,
  updateMessage,
} from './protocol';
import { COLLAB_CLOSE } from '../../shared/collab/close-codes';
import { describeDesignChanges, designSnapshot, type DesignChange, type DesignSnapshot } from '../../shared/collab/describe';

export interface RoomDeps {
  knex: Knex;
  logger: Logger;
  limits: CollabLimits;
  /** Appends synchronously (SQLite); without it every write takes the async Knex path. */
  syncWriter?: SyncUpdateWriter | null;
  /** Other processes serving the same rooms (Redis); null for one process. */
  cluster?: Cluster | null;
  /** Accepted changes, described, attributed to the member whose update made them. */
  onChanges?: (roomId: string, userId: string, changes: DesignChange[]) => void;
}

export interface PendingWrite {
  /** The socket it came from; null for a server-side edit (`Room.applyServerUpdate`). */
  conn: CollabConnection | null;
  userId: string | null;
  update: Uint8Array;
  decoded: ReturnType<typeof Y.decodeUpdate>;
  /** For a server-side edit: settled once it is stored and applied (or refused). */
  done?: { resolve: () => void; reject: (e: RoomWriteError) => void };
}

/** Why a server-side edit was not taken. */
export class RoomWriteError extends Error {
  constructor(
    readonly kind: 'too-large' | 'not-stored' | 'unloading',
    message: string,
  ) {
    super(message);
    this.name = 'RoomWriteError';
  }
}

/** The transaction origin of server-side edits on the live document (broadcast to every socket). */
export const SERVER_ORIGIN = Symbol('matchloom-server-update');

/** The transaction origin of updates another process stored and relayed (broadcast to every socket here). */
export const CLUSTER_ORIGIN = Symbol('matchloom-cluster-update');

/**
 * How long after an edit its room log description is made (ms): during a drag the document is read and
 * compared once per 500 ms, not per update (the room log sends a changing entry at most every 250 ms). At
 * 200 ms, in bench:collab's 50 rooms of three editors, the describing was a quarter of the server's
 * cost over a bare y-websocket server's (CPU per room 1.20 % against 0.76 %; 1.06 % at 500 ms).
 */
const DESCRIBE_DELAY_MS = 500;

/**
 * Presence (awareness) goes out in batches per room: whatever arrives within AWARENESS_BATCH_MS (cursor
 * moves, selections, leaves, renewals) is one message to each socket, so 100 people arriving or moving at
 * once cost about 100 sends, not 100 × 100. (Renewals, which each client sends every 15 s, were once held
 * for a second; in bench:collab, where the 100 clients share one process, the large batches that made
 * came as bursts of work and raised the p95 edit latency from about 15 to 33 ms.)
 */
const AWARENESS_BATCH_MS = 20;

type RoomState = 'open' | 'closing' | 'closed';
type AwarenessChanges = { added: number[]; updated: number[]; removed: number[] };

/** True when applying the update would change nothing (every struct known, every deletion done). */
export function updateIsRedundant(doc: Y.Doc, decoded: ReturnType<typeof Y.decodeUpdate>): boolean {
  for (const s of decoded.structs) {
    if (s instanceof Y.Skip) continue;
    if (Y.getState(doc.store, s.id.client) < s.id.clock + s.length) return false;
  }
  if (decoded.ds.clients.size === 0) return true;
  const have = Y.createDeleteSetFromStructStore(doc.store);
  for (const [client, ranges] of decoded.ds.clients) {
    const mine = have.clients.get(client) ?? [];
    for (const r of ranges) {
      if (r.len === 0) continue;
      // `mine` is sorted and merged: find the range holding r.clock and check it covers all of r.
      let lo = 0;
      let hi = mine.length - 1;
      let covered = false;
      while (lo <= hi) {
        const mid = (lo + hi) >> 1;
        const m = mine[mid];
        if (r.clock < m.clock) hi = mid - 1;
        else if (r.clock >= m.clock + m.len) lo = mid + 1;
        else {
          covered = r.clock + r.len <= m.clock + m.len;
          break;
        }
      }
      if (!covered) return false;
    }
  }
  return true;
}

export class Room {
  readonly conns = new Set<CollabConnection>();
  readonly awareness: awarenessProtocol.Awareness;
  state: RoomState = 'open';
  /** Resolves when the room has unloaded. */
  readonly closed: Promise<void>;
  private resolveClosed!: () => void;

  private refs = 0;
  private unloadTimer: NodeJS.Timeout | null = null;
  private readonly pending: PendingWrite[] = [];
  /** Admitted writes waiting for the async path (the synchronous writer found the database busy). */
  private stalled: PendingWrite[] = [];
  private draining: Promise<void> | null = null;
  private lastUpdateId: number;
  private sinceCompaction: number;
  /** An upper bound on the encoded document size (exact after each compaction). */
  private approxBytes: number;
  private lastSnapshot: DesignSnapshot | null;
  /** Which connection speaks for each awareness client id. */
  private readonly awarenessOwners = new Map<number, CollabConnection>();
  /** Whose edits since `lastSnapshot` are still to be described, and the timer that will. */
  private describeUser: string | null = null;
  private describeTimer: NodeJS.Timeout | null = null;
  /** Awareness client ids whose state is still to be sent, and the timer that sends them. */
  private readonly awarenessDue = new Set<number>();
  private awarenessTimer: NodeJS.Timeout | null = null;
  /** The document changed by another process's edit since `lastSnapshot` was read. */
  private snapshotStale = false;
  /** With other processes: the `room_updates` ids this copy holds (loaded, stored here or relayed). */
  readonly appliedLogIds = new Set<number>();
  /** With other processes: the stored state (`stateMarkOf`) as of the last read of the room. */
  private stateMark = '';

  private constructor(
    readonly id: string,
    readonly doc: Y.Doc,
    private readonly deps: RoomDeps,
    stored: { lastUpdateId: number; pendingUpdates: number },
    private readonly onIdle: (room: Room) => void,
  ) {
    this.closed = new Promise((r) => (this.resolveClosed = r));
    this.lastUpdateId = stored.lastUpdateId;
    this.sinceCompaction = stored.pendingUpdates;
    this.approxBytes = Y.encodeStateAsUpdate(doc).byteLength;
    this.lastSnapshot = designSnapshot(doc);
    this.awareness = new awarenessProtocol.Awareness(doc);
    this.awareness.setLocalState(null);
    this.awareness.on('update', this.onAwarenessUpdate);
  }

  static async load(id: string, deps: RoomDeps, onIdle: (room: Room) => void): Promise<Room> {
    // With other processes: listen to the room first, then read it, so that no update stored elsewhere
    // falls between the two (what arrives meanwhile is applied once the room exists; Yjs ignores repeats).
    let room: Room | null = null;
    const early: [RoomMessageKind, Uint8Array, number][] = [];
    if (deps.cluster) await deps.cluster.joinRoom(id, (kind, bytes, logId) => (room ? room.fromCluster(kind, bytes, logId) : early.push([kind, bytes, logId])));
    let stored;
    try {
      stored = await loadRoomDocument(deps.knex, id);
    } catch (e) {
      deps.cluster?.leaveRoom(id);
      throw e;
    }
    if (stored.skippedUpdates > 0) deps.logger.warn({ roomId: id, skipped: stored.skippedUpdates }, 'skipped damaged room updates while loading');
    const loaded = new Room(id, stored.doc, deps, stored, onIdle);
    if (deps.cluster) {
      for (const logId of stored.ids) loaded.appliedLogIds.add(logId);
      loaded.stateMark = stored.stateMark;
    }
    room = loaded;
    for (const [kind, bytes, logId] of early) loaded.fromCluster(kind, bytes, logId);
    return loaded;
  }

  /** An update or presence change another process accepted for this room: apply it and pass it on. */
  fromCluster(kind: RoomMessageKind, bytes: Uint8Array, logId = 0): void {
    if (this.state !== 'open') return;
    if (kind === 'update' && logId > 0) this.appliedLogIds.add(logId);
    try {
      if (kind === 'awareness') {
        awarenessProtocol.applyAwarenessUpdate(this.awareness, bytes, CLUSTER_ORIGIN);
        return;
      }
      // Edits made elsewhere are described there: settle ours, and re-read before describing the next.
      if (this.describeUser !== null) this.flushDescribe();
      Y.applyUpdate(this.doc, bytes, CLUSTER_ORIGIN);
      this.relay(bytes, null);
      this.snapshotStale = true;
      this.approxBytes += bytes.byteLength;
    } catch (e) {
      this.deps.logger.warn({ roomId: this.id, kind, err: e }, 'a relayed room message could not be applied');
    }
  }

  /**
   * With other processes: apply the log rows this copy has not seen. A process killed between storing an
   * update and publishing it leaves such a row; so may a Redis hiccup. Cheap: the room's row ids (a few
   * hundred at most between compactions), then only the missing rows' bytes. When another process has
   * compacted meanwhile (the rows may be gone into the state), the whole stored document is re-read.
   */
  async catchUpLog(): Promise<void> {
    if (this.state !== 'open' || !this.deps.cluster) return;
    const { knex } = this.deps;
    // The rows first, then the state: a compaction in between shows as a changed state (then the whole
    // room is re-read), never as rows gone missing unnoticed.
    const rows = await knex('room_updates').where({ room_id: this.id }).select('id');
    const state = await knex('room_states').where({ room_id: this.id }).first('upto_id', 'updated_at');
    if (this.state !== 'open') return;
    const stateMark = state ? stateMarkOf(state) : '';
    // catchUp records the state it read; if it fails, the next check tries again.
    if (stateMark !== this.stateMark) return this.catchUp();
    const present = new Set(rows.map((r) => Number(r.id)));
    const missing = [...present].filter((id) => !this.appliedLogIds.has(id));
    // Forget ids compacted away, so the set stays the size of the log.
    for (const id of this.appliedLogIds) if (!present.has(id)) this.appliedLogIds.delete(id);
    if (missing.length === 0) return;
    const found = await knex('room_updates').whereIn('id', missing.slice(0, 1000)).orderBy('id').select('id', 'update');
    if (this.state !== 'open') return;
    let applied = 0;
    for (const r of found) {
      const id = Number(r.id);
      if (this.appliedLogIds.has(id)) continue;
      this.fromCluster('update', new Uint8Array(r.update as Buffer), id);
      applied++;
    }
    if (applied > 0) this.deps.logger.warn({ roomId: this.id, applied }, 'applied stored room updates that were not relayed (a process stopped between storing and publishing them?)');
  }

  /**
   * Re-read the room from the database and apply what this copy lacks (after a Redis outage, when
   * relayed updates may have been missed, or after another process compacted).
   */
  async catchUp(): Promise<void> {
    if (this.state !== 'open') return;
    const stored = await loadRoomDocument(this.deps.knex, this.id);
    try {
      if (this.state !== 'open') return;
      this.stateMark = stored.stateMark;
      for (const logId of stored.ids) this.appliedLogIds.add(logId);
      const missing = Y.encodeStateAsUpdate(stored.doc, Y.encodeStateVector(this.doc));
      if (this.describeUser !== null) this.flushDescribe();
      Y.applyUpdate(this.doc, missing, CLUSTER_ORIGIN);
      this.relay(missing, null);
      this.snapshotStale = true;
    } finally {
      stored.doc.destroy();
    }
  }

  // ---- lifetime ----

  retain(): void {
    this.refs++;
    if (this.unloadTimer) clearTimeout(this.unloadTimer);
    this.unloadTimer = null;
  }

  release(): void {
    this.refs = Math.max(0, this.refs - 1);
    if (this.refs > 0 || this.state !== 'open') return;
    this.unloadTimer = setTimeout(() => {
      this.unloadTimer = null;
      if (this.refs === 0 && this.state === 'open') this.onIdle(this);
    }, this.deps.limits.unloadDelayMs);
    this.unloadTimer.unref();
  }

  /** Start serving a socket: send sync step 1 and the awareness states already known. */
  attach(conn: CollabConnection): void {
    this.conns.add(conn);
    conn.whenClosed(() => this.detach(conn));
    if (conn.closed) return;
    conn.send(syncStep1Message(this.doc));
    const states = [...this.awareness.getStates().keys()];
    if (states.length > 0) conn.send(awarenessMessage(this.awareness, states));
  }

  private detach(conn: CollabConnection): void {
    if (!this.conns.delete(conn)) return;
    const owned = [...conn.awarenessClients].filter((id) => this.awarenessOwners.get(id) === conn);
    for (const id of owned) this.awarenessOwners.delete(id);
    if (owned.length > 0 && this.state === 'open') {
      awarenessProtocol.removeAwarenessStates(this.awareness, owned, null);
      // The other processes drop them too (a removal at the same clock is taken).
      const known = owned.filter((id) => this.awareness.meta.has(id));
      if (known.length > 0) this.deps.cluster?.publishRoom(this.id, 'awareness', awarenessProtocol.encodeAwarenessUpdate(this.awareness, known));
    }
    this.release();
  }

  /** Close every socket, finish queued writes, compact, and free the document. */
  async unload(opts: { compact: boolean; closeCode?: number; closeReason?: string } = { compact: true }): Promise<void> {
    if (this.state !== 'open') return this.closed;
    this.state = 'closing';
    if (this.unloadTimer) clearTimeout(this.unloadTimer);
    for (const conn of [...this.conns]) conn.close(opts.closeCode ?? COLLAB_CLOSE.goingAway, opts.closeReason ?? 'the server is restarting');
    if (!opts.compact) {
      for (const w of [...this.pending, ...this.stalled]) w.done?.reject(new RoomWriteError('unloading', 'the room was deleted'));
      this.pending.length = 0;
      this.stalled = [];
    }
    // Store whatever is still queued (waiting for the database) before compacting.
    if (this.pending.length > 0 || this.stalled.length > 0) this.startDrain();
    await this.idle();
    if (opts.compact) this.flushDescribe();
    else if (this.describeTimer) clearTimeout(this.describeTimer);
    if (opts.compact && this.sinceCompaction > 0) await this.compact();
    this.deps.cluster?.leaveRoom(this.id);
    this.awareness.off('update', this.onAwarenessUpdate);
    if (this.awarenessTimer) clearTimeout(this.awarenessTimer);
    this.awareness.destroy();
    this.doc.destroy();
    this.state = 'closed';
    this.resolveClosed();
  }

  /** Resolves when the write queue is empty. */
  async idle(): Promise<void> {
    while (this.draining) await this.draining;
  }

  // ---- messages ----

  receive(conn: CollabConnection, data: Uint8Array): void {
    if (conn.closed || this.state !== 'open') return;
    const { limits, logger } = this.deps;
    if (data.byteLength > limits.maxMessageBytes) {
      conn.close(COLLAB_CLOSE.tooLarge, `message of ${formatBytes(data.byteLength)} is over the ${formatBytes(limits.maxMessageBytes)} limit`);
      return;
    }
    try {
      const msg = parseClientMessage(data);
      switch (msg.kind) {
        case 'sync-step-1':
          conn.send(syncStep2Message(this.doc, msg.stateVector));
          return;
        case 'sync-step-2':
        case 'update': {
          const decoded = decodeDocumentUpdate(msg.update);
          if (!conn.canWrite()) {
            // An observer's client answers the server's sync step 1 with its (usually empty) step 2:
            // only an update that would change something means its copy has diverged.
            if (!updateIsRedundant(this.doc, decoded)) conn.diverged = true;
            logger.debug({ roomId: this.id, userId: conn.userId, role: conn.role, kind: msg.kind }, 'dropped a document update from a member who may not edit');
            return;
          }
          this.pending.push({ conn, userId: conn.userId, update: msg.update, decoded });
          this.kick();
          return;
        }
        case 'awareness':
          this.receiveAwareness(conn, msg.update);
          return;
        case 'query-awareness':
          conn.send(awarenessMessage(this.awareness, [...this.awareness.getStates().keys()]));
          return;
      }
    } catch (e) {
      if (e instanceof ProtocolError) {
        logger.debug({ roomId: this.id, userId: conn.userId, reason: e.message }, 'closed a room socket that sent a malformed message');
        conn.close(COLLAB_CLOSE.badMessage, `malformed message: ${e.message}`);
        return;
      }
      logger.warn({ roomId: this.id, userId: conn.userId, err: e }, 'room socket message failed');
      conn.close(COLLAB_CLOSE.badMessage, 'the message could not be handled');
    }
  }

  private receiveAwareness(conn: CollabConnection, update: Uint8Array): void {
    const { limits, logger } = this.deps;
    if (update.byteLength > limits.maxAwarenessBytes) {
      conn.close(COLLAB_CLOSE.tooLarge, `presence update of ${formatBytes(update.byteLength)} is over the ${formatBytes(limits.maxAwarenessBytes)} limit`);
      return;
    }
    const entries = parseAwarenessUpdate(update);
    let added = 0;
    for (const e of entries) {
      const owner = this.awarenessOwners.get(e.clientId);
      // Another person's presence is not yours to change; your own from an older tab or socket is.
      if (owner && owner !== conn && owner.userId !== conn.userId) {
        logger.debug({ roomId: this.id, userId: conn.userId, clientId: e.clientId }, 'dropped an awareness update for a client id held by someone else');
        return;
      }
      if (owner !== conn && e.state !== null) added++;
    }
    if (conn.awarenessClients.size + added > limits.maxAwarenessClientsPerConnection) {
      logger.debug({ roomId: this.id, userId: conn.userId }, 'dropped an awareness update: too many client ids on one socket');
      return;
    }
    awarenessProtocol.applyAwarenessUpdate(this.awareness, update, conn);
    this.deps.cluster?.publishRoom(this.id, 'awareness', update);
    for (const e of entries) {
      const owner = this.awarenessOwners.get(e.clientId);
      if (e.state === null) {
        if (owner === conn) this.awarenessOwners.delete(e.clientId);
        conn.awarenessClients.delete(e.clientId);
      } else if (owner !== conn) {
        owner?.awarenessClients.delete(e.clientId);
        this.awarenessOwners.set(e.clientId, conn);
        conn.awarenessClients.add(e.clientId);
      }
    }
  }

  /** Changes and renewals alike: sent with whatever else arrives within AWARENESS_BATCH_MS. */
  private readonly onAwarenessUpdate = (changes: AwarenessChanges): void => {
    for (const ids of [changes.added, changes.updated, changes.removed]) for (const id of ids) this.awarenessDue.add(id);
    if (this.awarenessDue.size > 0) this.awarenessTimer ??= setTimeout(this.sendAwareness, AWARENESS_BATCH_MS);
  };

  private readonly sendAwareness = (): void => {
    this.awarenessTimer = null;
    if (this.awarenessDue.size === 0 || this.state === 'closed') return;
    const msg = awarenessMessage(this.awareness, [...this.awarenessDue]);
    this.awarenessDue.clear();
    // To every socket, the sender too: the y-websocket client treats 30 s without a message as a dead link.
    for (const c of this.conns) c.send(msg);
  };

  /**
   * Pass an update on to every socket but its sender's, as the bytes that were stored (or relayed by
   * another process). The document has no 'update' listener, so Yjs never re-encodes a transaction.
   * Updates are idempotent and commute, so peers may take the bytes as sent: what they already know is
   * ignored, and what waits on a missing update waits there as it does here.
   */
  private relay(update: Uint8Array, sender: CollabConnection | null): void {
    let msg: Uint8Array | null = null; // encoded once, and only if someone else is in the room
    for (const c of this.conns) if (c !== sender) c.send((msg ??= updateMessage(update)));
  }

  // ---- the write queue ----

  /**
   * Process the queue. With a synchronous writer (SQLite) the queued updates are stored at once, in
   * this turn of the event loop (one short transaction, no disk flush: WAL with synchronous=NORMAL),
   * then relayed and applied; otherwise (another database, or a busy moment) the queue drains
   * asynchronously, still in order.
   */
  private kick(): void {
    if (this.draining || this.state === 'closed') return;
    if (this.deps.syncWriter && this.stalled.length === 0) {
      this.storeNow(this.deps.syncWriter);
      return;
    }
    this.startDrain();
  }

  private startDrain(): void {
    if (this.draining) return;
    this.draining = this.drain().finally(() => {
      this.draining = null;
      if ((this.pending.length > 0 || this.stalled.length > 0) && this.state !== 'closed') this.kick();
    });
  }

  /** Store the queue synchronously; on a busy database hand it to the async path (which retries). */
  private storeNow(writer: SyncUpdateWriter): void {
    const batch = this.admit(this.pending.splice(0));
    if (batch.length === 0) return;
    let ids: number[] | null;
    try {
      ids = writer.append(this.id, this.rows(batch));
    } catch (e) {
      this.storeFailed(batch, e);
      return;
    }
    if (ids === null) {
      this.stalled = batch;
      this.startDrain();
      return;
    }
    this.applyStored(batch, ids);
    if (this.sinceCompaction >= this.deps.limits.compactEvery && !this.compactNow()) this.startDrain();
  }

  /** The queued writes that may be stored: the writer may still edit, the update is new, it fits. */
  private admit(batch: PendingWrite[]): PendingWrite[] {
    const { logger, limits } = this.deps;
    const accepted: PendingWrite[] = [];
    for (const w of batch) {
      if (w.conn && !w.conn.mayWrite()) {
        if (!w.conn.closed) {
          logger.debug({ roomId: this.id, userId: w.conn.userId }, 'dropped a queued update: the member may no longer edit');
          if (!updateIsRedundant(this.doc, w.decoded)) w.conn.diverged = true;
        }
        continue;
      }
      if (updateIsRedundant(this.doc, w.decoded)) {
        w.done?.resolve();
        continue;
      }
      if (this.approxBytes + w.update.byteLength > limits.maxDocumentBytes) {
        this.approxBytes = Y.encodeStateAsUpdate(this.doc).byteLength;
        if (this.approxBytes + w.update.byteLength > limits.maxDocumentBytes) {
          const reason = `the room document would pass its ${formatBytes(limits.maxDocumentBytes)} limit (now ${formatBytes(this.approxBytes)})`;
          w.conn?.close(COLLAB_CLOSE.tooLarge, reason);
          w.done?.reject(new RoomWriteError('too-large', reason));
          continue;
        }
      }
      this.approxBytes += w.update.byteLength;
      accepted.push(w);
    }
    return accepted;
  }

  rows(batch: PendingWrite[]) {
    return batch.map((w) => ({ update: w.update, userId: w.userId }));
  }

  private storeFailed(batch: PendingWrite[], e: unknown): void {
    this.deps.logger.error({ roomId: this.id, err: e }, 'could not store room updates; their senders will reconnect and resend');
    for (const w of batch) {
      w.conn?.close(COLLAB_CLOSE.serverError, 'the update could not be stored; reconnecting');
      w.done?.reject(new RoomWriteError('not-stored', 'the change could not be stored'));
    }
  }

  /** Apply stored updates in order, pass each on to the other sockets (`relay`) and describe them. */
  private applyStored(batch: PendingWrite[], ids: number[]): void {
    for (let i = 0; i < batch.length; i++) {
      const w = batch[i];
      // The pending description belongs to whoever made the edits since the last one: settle it first.
      if (this.describeUser !== null && this.describeUser !== w.userId) this.flushDescribe();
      if (this.snapshotStale) {
        this.lastSnapshot = designSnapshot(this.doc);
        this.snapshotStale = false;
      }
      try {
        // Stored, so it may go out before it is applied here: the others get it one apply sooner. These
        // are the bytes every process and every later load applies; bytes that decode (checked on
        // arrival) but fail to apply fail on the peers as they do here, are skipped at every later load,
        // and their sender is closed (below).
        this.relay(w.update, w.conn);
        Y.applyUpdate(this.doc, w.update, w.conn ?? SERVER_ORIGIN);
        if (this.deps.cluster) {
          this.appliedLogIds.add(ids[i]);
          this.deps.cluster.publishRoom(this.id, 'update', w.update, ids[i]);
        }
      } catch (e) {
        this.deps.logger.warn({ roomId: this.id, userId: w.userId, err: e }, 'a stored update could not be applied');
        w.conn?.close(COLLAB_CLOSE.badMessage, 'the update could not be applied');
      }
      this.lastUpdateId = ids[i];
      this.sinceCompaction++;
      if (w.userId) this.describeSoon(w.userId);
      else this.lastSnapshot = designSnapshot(this.doc);
      w.done?.resolve();
    }
  }

  private async drain(): Promise<void> {
    const { knex, limits, syncWriter } = this.deps;
    while (this.stalled.length > 0 || this.pending.length > 0 || this.sinceCompaction >= limits.compactEvery) {
      if (this.sinceCompaction >= limits.compactEvery) {
        if (!(await this.compact())) break; // failed: try again after the next update
        continue;
      }
      const batch = this.stalled.length > 0 ? this.stalled.splice(0) : this.admit(this.pending.splice(0));
      if (batch.length === 0) continue;
      let ids: number[];
      try {
        ids = syncWriter?.append(this.id, this.rows(batch)) ?? (await appendUpdates(knex, this.id, this.rows(batch)));
      } catch (e) {
        this.storeFailed(batch, e);
        continue;
      }
      this.applyStored(batch, ids);
    }
  }

  /**
   * Describe `userId`'s edits for the room log a moment later, off the broadcast path: a run of edits
   * by one person is read and compared once (an edit by someone else settles the run first).
   */
  private describeSoon(userId: string): void {
    this.describeUser = userId;
    // (the timer stays set until the queued describe runs, so edits meanwhile join this run)
    this.describeTimer ??= setTimeout(() => backgroundQueue.push(() => this.flushDescribe()), DESCRIBE_DELAY_MS);
  }

  /** Describe now whatever edits are waiting to be described (before the room log is read). */
  flushDescribe(): void {
    if (this.describeTimer) clearTimeout(this.describeTimer);
    this.describeTimer = null;
    const userId = this.describeUser;
    this.describeUser = null;
    if (userId !== null && this.state !== 'closed') this.describe(userId);
  }

  private describe(userId: string): void {
    const after = designSnapshot(this.doc);
    const before = this.lastSnapshot;
    this.lastSnapshot = after;
    if (!before || !after || !this.deps.onChanges) return;
    try {
      const changes = describeDesignChanges(before, after);
      if (changes.length > 0) this.deps.onChanges(this.id, userId, changes);
    } catch (e) {
      this.deps.logger.warn({ roomId: this.id, err: e }, 'could not describe a room change');
    }
  }

  /**
   * With other processes writing the same room, this copy may lag what is stored (a relayed update still
   * on its way), so the compacted state is made from the database alone (`compactRoomDocument`, which
   * locks the room's state row on PostgreSQL).
   */
  private async compactFromStore(): Promise<boolean> {
    try {
      await compactRoomDocument(this.deps.knex, this.id);
      this.sinceCompaction = 0;
      return true;
    } catch (e) {
      this.deps.logger.warn({ roomId: this.id, err: e }, 'room compaction failed; will retry');
      return false;
    }
  }

  /** Compact synchronously (SQLite); false when the database was busy (the async drain retries). */
  private compactNow(): boolean {
    if (this.deps.cluster) return false; // from the store, on the async path
    const state = Y.encodeStateAsUpdate(this.doc);
    try {
      if (!this.deps.syncWriter!.saveState(this.id, state, this.lastUpdateId)) return false;
    } catch (e) {
      this.deps.logger.warn({ roomId: this.id, err: e }, 'room compaction failed; will retry');
      this.sinceCompaction = 0;
      return true;
    }
    this.sinceCompaction = 0;
    this.approxBytes = state.byteLength;
    return true;
  }

  /** Write the in-memory document as the compacted state (called only between writes). */
  private async compact(): Promise<boolean> {
    if (this.deps.cluster) return this.compactFromStore();
    const state = Y.encodeStateAsUpdate(this.doc);
    try {
      if (!this.deps.syncWriter?.saveState(this.id, state, this.lastUpdateId)) await saveRoomState(this.deps.knex, this.id, state, this.lastUpdateId);
      this.sinceCompaction = 0;
      this.approxBytes = state.byteLength;
      return true;
    } catch (e) {
      this.deps.logger.warn({ roomId: this.id, err: e }, 'room compaction failed; will retry');
      return false;
    }
  }

  /**
   * A server-side edit (restoring a snapshot, applying an upload): queued like a socket's update,
   * stored, applied to the live document and broadcast to every socket, attributed to `userId` in the
   * room log. Resolves once stored and applied; rejects with `RoomWriteError`. Throws `ProtocolError`
   * for bytes that are not a Yjs update.
   */
  applyServerUpdate(update: Uint8Array, userId: string | null): Promise<void> {
    const decoded = decodeDocumentUpdate(update);
    if (this.state !== 'open') return Promise.reject(new RoomWriteError('unloading', 'the room is unloading'));
    return new Promise<void>((resolve, reject) => {
      this.pending.push({ conn: null, userId, update, decoded, done: { resolve, reject } });
      this.kick();
    });
  }

  /**
   * A member's role changed (null: removed). A socket whose updates were dropped while it could not edit
   * and that may edit now is asked to reconnect (4100), so that its copy and the room's agree again.
   */
  setRole(userId: string, role: CollabConnection['role'] | null): void {
    for (const conn of [...this.conns]) {
      if (conn.userId !== userId) continue;
      conn.roleSetByHub = true;
      if (role === null) {
        conn.revoked = true;
        conn.close(COLLAB_CLOSE.forbidden, 'you were removed from this room');
        continue;
      }
      conn.role = role;
      if (conn.diverged && conn.canWrite()) conn.close(COLLAB_CLOSE.resync, 'you may edit again; reconnecting to resynchronise');
    }
  }
}
