/**
 * The room log: who changed what, when, in words ("Ada changed C2 from 1.2 pF to 1.5 pF"), stored in
 * `room_log` and sent to the room as it happens. Rapid edits of one field by one person (within
 * `logCoalesceMs` of each other) are one entry: the first edit inserts the row and sends it; later ones
 * send it again with the same id and the new wording (at most every EMIT_MS), and the row is rewritten
 * once the edits stop (or at shutdown), so a drag of a value slider costs two writes, not fifty.
 * On SQLite the rows are written synchronously on the room socket's own connection (`SyncLogRows`, about
 * 20 µs) whenever nothing is waiting in the async queue; otherwise (another database, a busy moment, a
 * name not yet known) they go through Knex, in order.
 */
import type { Knex } from 'knex';
import type { Logger } from 'pino';
import type { CollabLimits } from './limits';
import type { SyncUpdateWriter } from './store';
import { changeSentence, mergeChanges, type DesignChange } from '../../shared/collab/describe';
import type { RoomLogEntry } from '../../shared/collab/events';

const EMIT_MS = 250;
const NAME_TTL_MS = 60_000;
const UNKNOWN_NAME = 'Someone';
/** Settled bursts are forgotten at most this often (ms). */
const PRUNE_MS = 1_000;

/** The synchronous room log writes of the SQLite writer. */
export type SyncLogRows = Pick<SyncUpdateWriter, 'insertLog' | 'updateLog'>;

interface Burst {
  roomId: string;
  userId: string;
  change: DesignChange;
  lastAt: number;
  id: number | null;
  /** Wording changed since it was last sent / last written. */
  unsent: boolean;
  unwritten: boolean;
  emitTimer: NodeJS.Timeout | null;
  writeTimer: NodeJS.Timeout | null;
}

export class RoomLogWriter {
  private readonly bursts = new Map<string, Burst>();
  private readonly names = new Map<string, { name: string; at: number }>();
  private chain: Promise<void> = Promise.resolve();
  /** Operations waiting in `chain`; the synchronous path runs only when there are none (keeps the order). */
  private queued = 0;
  private prunedAt = 0;

  constructor(
    private readonly knex: Knex,
    private readonly logger: Logger,
    private readonly limits: CollabLimits,
    private readonly emit: (roomId: string, entry: RoomLogEntry) => void,
    private readonly syncRows: SyncLogRows | null = null,
  ) {}

  /** Record the changes one accepted update made. */
  record(roomId: string, userId: string, changes: readonly DesignChange[]): void {
    const now = Date.now();
    for (const c of changes) {
      const key = `${roomId}\u0000${userId}\u0000${c.key}`;
      const b = this.bursts.get(key);
      if (b && now - b.lastAt <= this.limits.logCoalesceMs) {
        const merged = mergeChanges(b.change, c);
        if (merged) {
          b.change = merged;
          b.lastAt = now;
          this.changed(b);
          continue;
        }
      }
      if (b) this.settle(b);
      const burst: Burst = { roomId, userId, change: c, lastAt: now, id: null, unsent: false, unwritten: false, emitTimer: null, writeTimer: null };
      this.bursts.set(key, burst);
      if (!this.insertNow(burst)) this.enqueue(() => this.insert(burst));
    }
    this.prune(now);
  }

  /** The room's latest entries, oldest first. */
  async history(roomId: string, limit = this.limits.logHistory): Promise<RoomLogEntry[]> {
    const rows = await this.knex('room_log as l')
      .leftJoin('users as u', 'u.id', 'l.user_id')
      .where('l.room_id', roomId)
      .orderBy('l.id', 'desc')
      .limit(limit)
      .select('l.id', 'l.user_id', 'l.message', 'l.created_at', 'u.display_name');
    // An entry whose edits are still going on has newer wording in memory than in its row.
    const live = new Map<number, Burst>();
    for (const b of this.bursts.values()) if (b.roomId === roomId && b.id !== null && b.unwritten) live.set(b.id, b);
    return Promise.all(
      rows.reverse().map(async (r) => {
        const b = live.get(Number(r.id));
        if (b) return this.entry(b, b.id!);
        return {
          id: Number(r.id),
          roomId,
          userId: r.user_id ?? null,
          displayName: r.display_name ?? UNKNOWN_NAME,
          message: String(r.message),
          at: Number(r.created_at),
        };
      }),
    );
  }

  /** A member's display name (cached for a minute). */
  async displayName(userId: string): Promise<string> {
    const hit = this.names.get(userId);
    if (hit && Date.now() - hit.at < NAME_TTL_MS) return hit.name;
    const row = await this.knex('users').where({ id: userId }).first('display_name');
    const name = row?.display_name ? String(row.display_name) : UNKNOWN_NAME;
    this.names.set(userId, { name, at: Date.now() });
    return name;
  }

  /** Send and write every pending rewording, and wait for all writes. */
  async flush(): Promise<void> {
    for (const b of this.bursts.values()) this.settle(b);
    await this.chain;
  }

  /** Forget a deleted room's bursts. */
  forgetRoom(roomId: string): void {
    for (const [k, b] of this.bursts) {
      if (b.roomId !== roomId) continue;
      this.clearTimers(b);
      this.bursts.delete(k);
    }
  }

  private enqueue(op: () => Promise<void>): void {
    this.queued++;
    this.chain = this.chain
      .then(op)
      .catch((e: unknown) => {
        this.logger.warn({ err: e }, 'room log write failed');
      })
      .finally(() => {
        this.queued--;
      });
  }

  /** The entry, if it can be worded without a query (the name is cached) and nothing is queued before it. */
  private entryNow(b: Burst, id: number): RoomLogEntry | null {
    if (this.queued > 0) return null;
    const hit = this.names.get(b.userId);
    if (!hit || Date.now() - hit.at >= NAME_TTL_MS) return null;
    return { id, roomId: b.roomId, userId: b.userId, displayName: hit.name, message: `${hit.name} ${changeSentence(b.change)}`, at: b.lastAt };
  }

  /** `insert`, synchronously; false when it must take the async path. */
  private insertNow(b: Burst): boolean {
    const draft = this.syncRows ? this.entryNow(b, 0) : null;
    if (!draft) return false;
    let id: number | null;
    try {
      id = this.syncRows!.insertLog(b.roomId, b.userId, draft.message.slice(0, 1000), draft.at);
    } catch (e) {
      this.logger.warn({ err: e }, 'room log write failed');
      return true;
    }
    if (id === null) return false;
    b.id = id;
    this.emit(b.roomId, { ...draft, id });
    return true;
  }

  /** `write`, synchronously; false when it must take the async path. */
  private writeNow(b: Burst): boolean {
    const e = this.syncRows && b.id !== null ? this.entryNow(b, b.id) : null;
    if (!e) return false;
    try {
      if (!this.syncRows!.updateLog(e.id, e.message.slice(0, 1000), e.at)) return false;
    } catch (err) {
      this.logger.warn({ err }, 'room log write failed');
    }
    b.unwritten = false;
    return true;
  }

  /** A merge changed the wording: send it soon, write it when the edits stop. */
  private changed(b: Burst): void {
    b.unsent = true;
    b.unwritten = true;
    if (!b.emitTimer) b.emitTimer = setTimeout(() => this.emitNow(b), EMIT_MS);
    if (b.writeTimer) clearTimeout(b.writeTimer);
    b.writeTimer = setTimeout(() => this.settle(b), this.limits.logCoalesceMs + EMIT_MS);
  }

  /** Send and write the burst's latest wording now. */
  private settle(b: Burst): void {
    if (b.unsent) this.emitNow(b);
    this.clearTimers(b);
    if (b.unwritten && !this.writeNow(b)) this.enqueue(() => this.write(b));
  }

  private clearTimers(b: Burst): void {
    if (b.emitTimer) clearTimeout(b.emitTimer);
    if (b.writeTimer) clearTimeout(b.writeTimer);
    b.emitTimer = null;
    b.writeTimer = null;
  }

  private emitNow(b: Burst): void {
    if (b.emitTimer) clearTimeout(b.emitTimer);
    b.emitTimer = null;
    if (!b.unsent) return;
    const now = b.id !== null ? this.entryNow(b, b.id) : null;
    if (now) {
      b.unsent = false;
      this.emit(b.roomId, now);
      return;
    }
    // After the insert (which gives the id): the send goes through the same queue.
    this.enqueue(async () => {
      if (b.id === null || !b.unsent) return;
      b.unsent = false;
      this.emit(b.roomId, await this.entry(b, b.id));
    });
  }

  private async entry(b: Burst, id: number): Promise<RoomLogEntry> {
    const displayName = await this.displayName(b.userId);
    return { id, roomId: b.roomId, userId: b.userId, displayName, message: `${displayName} ${changeSentence(b.change)}`, at: b.lastAt };
  }

  private async insert(b: Burst): Promise<void> {
    const draft = await this.entry(b, 0);
    const [row] = await this.knex('room_log')
      .insert({ room_id: b.roomId, user_id: b.userId, message: draft.message.slice(0, 1000), created_at: draft.at })
      .returning('id');
    b.id = typeof row === 'object' ? Number((row as { id: number }).id) : Number(row);
    this.emit(b.roomId, { ...draft, id: b.id });
  }

  private async write(b: Burst): Promise<void> {
    if (!b.unwritten || b.id === null) return;
    b.unwritten = false;
    const e = await this.entry(b, b.id);
    await this.knex('room_log').where({ id: b.id }).update({ message: e.message.slice(0, 1000), created_at: e.at });
  }

  private prune(now: number): void {
    if (now - this.prunedAt < PRUNE_MS) return;
    this.prunedAt = now;
    for (const [k, b] of this.bursts)
      if (!b.emitTimer && !b.writeTimer && !b.unsent && !b.unwritten && now - b.lastAt > this.limits.logCoalesceMs) this.bursts.delete(k);
  }
}
