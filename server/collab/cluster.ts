/**
 * Several Matchloom processes in step through Redis (`REDIS_URL`). PostgreSQL (or SQLite) stays the
 * durable copy; Redis only carries what the other processes must know now:
 *
 *   - `ml:room:<roomId>`: every accepted document update and every presence (awareness) update of the
 *     room, binary: one kind byte (0 update, 1 awareness), the 16-byte id of the sending process, the
 *     update's row id in `room_updates` (8 bytes, float64 big-endian; 0 for presence), the Yjs bytes. A process subscribes while it has the room loaded (before reading it from the
 *     database, so nothing falls between the read and the subscription).
 *   - `ml:control`: JSON messages to every process: role changes, removals and deletions (which take
 *     effect on the open sockets there), socket.io presence lists and follow-mode views.
 *
 * socket.io's own broadcasts go through `@socket.io/redis-adapter` on a connection pair of its own.
 * After Redis comes back from an outage, `onResync` handlers run so that loaded rooms re-read what the
 * other processes stored meanwhile.
 */
import { randomBytes } from 'node:crypto';
import { Redis } from 'ioredis';
import type { Logger } from 'pino';
import { createAdapter } from '@socket.io/redis-adapter';
import type { Role } from '../auth/tokens';
import type { ViewState } from '../../shared/collab/events';

export type RoomMessageKind = 'update' | 'awareness';
export type RoomMessageHandler = (kind: RoomMessageKind, bytes: Uint8Array, logId: number) => void;

/** A socket.io member as another process sees it. */
export interface ClusterMember {
  socketId: string;
  userId: string;
  displayName: string;
  role: Role;
  following: string | null;
}

export type ClusterMessage =
  | { type: 'role'; roomId: string; userId: string; role: Role | null }
  | { type: 'room-deleted'; roomId: string }
  | { type: 'presence'; roomId: string; members: ClusterMember[] }
  | { type: 'presence-query' }
  | { type: 'view'; roomId: string; userId: string; view: ViewState };

export interface Cluster {
  /** This process's id on the wire (hex). */
  readonly processId: string;
  /** Receive the room's messages from other processes; resolves once subscribed. */
  joinRoom(roomId: string, onMessage: RoomMessageHandler): Promise<void>;
  leaveRoom(roomId: string): void;
  /** `logId`: the update's row id in `room_updates` (0 for presence). */
  publishRoom(roomId: string, kind: RoomMessageKind, bytes: Uint8Array, logId?: number): void;
  publish(message: ClusterMessage): void;
  /** Messages from other processes on the control channel (with the sender's process id). */
  onControl(handler: (message: ClusterMessage, from: string) => void): void;
  onResync(handler: () => void): void;
  /** The socket.io adapter factory (its own Redis connections). */
  socketIoAdapter(): ReturnType<typeof createAdapter>;
  close(): Promise<void>;
}

const CONTROL = 'ml:control';
const roomChannel = (roomId: string) => `ml:room:${roomId}`;
const KIND_BYTE: Record<RoomMessageKind, number> = { update: 0, awareness: 1 };
const ID_BYTES = 16;
const HEAD_BYTES = 1 + ID_BYTES + 8;
/** How long a process waits for Redis at start before giving up with a clear message (ms). */
const CONNECT_TIMEOUT_MS = 10_000;

export class ClusterError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ClusterError';
  }
}

function parseControl(raw: string): { from: string; message: ClusterMessage } | null {
  try {
    const v = JSON.parse(raw) as { from?: unknown; message?: { type?: unknown } };
    if (typeof v.from !== 'string' || !v.message || typeof v.message.type !== 'string') return null;
    return { from: v.from, message: v.message as ClusterMessage };
  } catch {
    return null;
  }
}

async function ready(client: Redis, url: string): Promise<void> {
  if (client.status === 'ready') return;
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => {
      cleanup();
      reject(new ClusterError(`could not reach Redis at ${redactRedisUrl(url)} within ${CONNECT_TIMEOUT_MS / 1000} s`));
    }, CONNECT_TIMEOUT_MS);
    const onReady = () => {
      cleanup();
      resolve();
    };
    const cleanup = () => {
      clearTimeout(timer);
      client.off('ready', onReady);
    };
    client.on('ready', onReady);
  });
}

/** The URL without its password, for messages and logs. */
export function redactRedisUrl(url: string): string {
  try {
    const u = new URL(url);
    if (u.password) u.password = '***';
    return u.toString();
  } catch {
    return 'the configured REDIS_URL';
  }
}

/** Connect to Redis; throws `ClusterError` if it cannot be reached. */
export async function connectCluster(url: string, logger: Logger): Promise<Cluster> {
  const log = logger.child({ module: 'cluster' });
  const idBytes = randomBytes(ID_BYTES);
  const processId = idBytes.toString('hex');
  const options = { lazyConnect: false, maxRetriesPerRequest: null, retryStrategy: (n: number) => Math.min(200 * n, 2000) };
  const pub = new Redis(url, options);
  const sub = new Redis(url, options);
  const adapterPub = new Redis(url, options);
  const adapterSub = new Redis(url, options);
  const clients = [pub, sub, adapterPub, adapterSub];
  let warned = false;
  for (const c of clients)
    c.on('error', (e: Error) => {
      if (warned) return;
      warned = true;
      log.warn({ err: e.message }, 'Redis connection trouble; retrying');
    });
  try {
    await Promise.all(clients.map((c) => ready(c, url)));
  } catch (e) {
    for (const c of clients) c.disconnect();
    throw e;
  }

  const rooms = new Map<string, RoomMessageHandler>();
  const controlHandlers: ((m: ClusterMessage, from: string) => void)[] = [];
  const resyncHandlers: (() => void)[] = [];
  await sub.subscribe(CONTROL);

  sub.on('messageBuffer', (channelBuf: Buffer, message: Buffer) => {
    const channel = channelBuf.toString();
    if (channel === CONTROL) {
      const parsed = parseControl(message.toString());
      if (!parsed || parsed.from === processId) return;
      for (const h of controlHandlers) {
        try {
          h(parsed.message, parsed.from);
        } catch (e) {
          log.warn({ err: e, type: parsed.message.type }, 'a cluster control message could not be handled');
        }
      }
      return;
    }
    if (!channel.startsWith('ml:room:') || message.byteLength < HEAD_BYTES) return;
    if (message.subarray(1, 1 + ID_BYTES).equals(idBytes)) return; // our own
    const handler = rooms.get(channel.slice('ml:room:'.length));
    const kind: RoomMessageKind | null = message[0] === 0 ? 'update' : message[0] === 1 ? 'awareness' : null;
    if (!handler || !kind) return;
    const logId = message.readDoubleBE(1 + ID_BYTES);
    const bytes = new Uint8Array(message.buffer, message.byteOffset + HEAD_BYTES, message.byteLength - HEAD_BYTES);
    handler(kind, bytes.slice(), logId);
  });

  // The subscriber is ready already: a later `ready` means it reconnected (ioredis resubscribes by
  // itself), and messages may have been missed meanwhile.
  let closing = false;
  sub.on('close', () => closing || log.warn('lost the Redis subscription; rooms will re-read the database when it is back'));
  sub.on('ready', () => {
    warned = false; // the next trouble is news again
    log.info('Redis subscription is back; re-reading loaded rooms');
    for (const h of resyncHandlers) h();
  });

  return {
    processId,
    async joinRoom(roomId, onMessage) {
      rooms.set(roomId, onMessage);
      await sub.subscribe(roomChannel(roomId));
    },
    leaveRoom(roomId) {
      if (!rooms.delete(roomId)) return;
      void sub.unsubscribe(roomChannel(roomId)).catch(() => {});
    },
    publishRoom(roomId, kind, bytes, logId = 0) {
      const frame = Buffer.allocUnsafe(HEAD_BYTES + bytes.byteLength);
      frame[0] = KIND_BYTE[kind];
      idBytes.copy(frame, 1);
      frame.writeDoubleBE(logId, 1 + ID_BYTES);
      frame.set(bytes, HEAD_BYTES);
      void pub.publish(roomChannel(roomId), frame).catch((e: Error) => log.warn({ err: e.message, roomId }, 'could not publish a room update'));
    },
    publish(message) {
      void pub.publish(CONTROL, JSON.stringify({ from: processId, message })).catch((e: Error) => log.warn({ err: e.message }, 'could not publish a cluster message'));
    },
    onControl(handler) {
      controlHandlers.push(handler);
    },
    onResync(handler) {
      resyncHandlers.push(handler);
    },
    socketIoAdapter() {
      return createAdapter(adapterPub, adapterSub, { key: 'ml:socket.io' });
    },
    async close() {
      closing = true;
      rooms.clear();
      await Promise.allSettled(clients.map((c) => c.quit()));
      for (const c of clients) c.disconnect();
    },
  };
}
