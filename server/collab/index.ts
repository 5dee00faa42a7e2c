/**
 * The collaboration hub: the Yjs room socket at `/collab/<roomId>` and the socket.io room events
 * (`/socket.io`), on the application's http server. The server wires it in `server/main.ts`:
 *
 *   const hub = createCollabHub({ knex, tokens, logger, config }); hub.attach(httpServer);
 *   // after a role change or removal:  hub.roleChanged(roomId, userId, role | null)
 *   // after a room is deleted:         hub.roomDeleted(roomId)
 *   // after a snapshot is created:     hub.emit(roomId, ROOM_EVENTS.snapshotCreated, payload)
 *   // a server-side document edit:     await hub.applyUpdate(roomId, update, userId)
 *   // on shutdown:                     await hub.close()
 *
 * The socket's rules (authorisation, roles, limits, close codes, storage) are in server/collab/README.md.
 */
import type http from 'node:http';
import type { Duplex } from 'node:stream';
import type { Knex } from 'knex';
import type { Logger } from 'pino';
import { WebSocketServer } from 'ws';
import type { Config } from '../config';
import type { Role, TokenService } from '../auth/tokens';
import { getRole } from '../rooms/membership';
import { authoriseRoom, identifyUser } from './auth';
import { CollabConnection, closeReason } from './connection';
import { DEFAULT_LIMITS, formatBytes, type CollabLimits } from './limits';
import { RoomWriteError, type Room } from './room';
import { HttpError } from '../errors';
import { RoomEvents } from './room-events';
import { RoomLogWriter } from './room-log';
import { RoomRegistry } from './rooms';
import { openSyncUpdateWriter } from './store';
import type { Cluster } from './cluster';
import { COLLAB_CLOSE } from '../../shared/collab/close-codes';

export interface CollabHub {
  /** Handle `/collab/<roomId>` upgrades and mount socket.io at `/socket.io` on this server. */
  attach(httpServer: http.Server): void;
  /** A member's role changed (`null`: removed). Takes effect at once on open sockets. */
  roleChanged(roomId: string, userId: string, role: Role | null): void;
  /** The room is gone: disconnect everyone in it (4404) and forget its document. */
  roomDeleted(roomId: string): void;
  /** Send a room event (e.g. `ROOM_EVENTS.snapshotCreated`) to every events socket in the room. */
  emit(roomId: string, event: string, payload: unknown): void;
  /**
   * A server-side edit of the room document (a Yjs update made on a copy of it): stored, applied to the
   * live document and sent to every open socket, in order with the members' edits, and attributed to
   * `userId` in the room log. Resolves once stored. Throws `HttpError` 413 past the size limits, 503 if
   * it could not be stored or the room is going away.
   */
  applyUpdate(roomId: string, update: Uint8Array, userId: string | null): Promise<void>;
  /** Close every socket, store every loaded document (compacted), detach from the server. */
  close(): Promise<void>;
}

export interface CollabDeps {
  knex: Knex;
  tokens: TokenService;
  logger: Logger;
  config: Config;
  /** Other processes serving the same rooms (Redis, `REDIS_URL`); closed with the hub. */
  cluster?: Cluster | null;
}

export const COLLAB_PATH = '/collab/';
/** With other processes, how often each loaded room checks the log for rows it has not seen (ms). */
const CLUSTER_CATCH_UP_MS = 2_000;
const ROOM_ID = /^[A-Za-z0-9_-]{1,100}$/;

interface Refusal {
  code: number;
  reason: string;
}

/** `limits` overrides the defaults (tests and benchmarks shorten the timings). */
export function createCollabHub(deps: CollabDeps, limitsOverride: Partial<CollabLimits> = {}): CollabHub {
  const { knex, tokens, config } = deps;
  const limits: CollabLimits = { ...DEFAULT_LIMITS, ...limitsOverride };
  const logger = deps.logger.child({ module: 'collab' });

  // eslint-disable-next-line prefer-const
  let events: RoomEvents;
  const syncWriter = openSyncUpdateWriter(knex);
  const roomLog = new RoomLogWriter(knex, logger, limits, (roomId, entry) => events.emitLog(roomId, entry), syncWriter);
  // eslint-disable-next-line prefer-const
  let registry: RoomRegistry;
  const cluster = deps.cluster ?? null;
  events = new RoomEvents({
    knex,
    tokens,
    logger,
    limits,
    roomLog,
    publicUrl: config.publicUrl,
    settleLog: (roomId) => registry.get(roomId)?.flushDescribe(),
    cluster,
  });
  registry = new RoomRegistry({
    knex,
    logger,
    limits,
    syncWriter,
    cluster,
    onChanges: (roomId, userId, changes) => roomLog.record(roomId, userId, changes),
  });
  // The hard cap sits above the per-message limit so that an oversized message gets a clear 4413.
  const wss = new WebSocketServer({ noServer: true, maxPayload: limits.maxDocumentBytes + 64 * 1024, perMessageDeflate: false });
  const connections = new Set<CollabConnection>();
  let server: http.Server | null = null;
  let closing = false;

  const ping = setInterval(() => {
    for (const c of connections) {
      if (c.awaitingPong) {
        c.terminate();
        continue;
      }
      c.awaitingPong = true;
      try {
        c.ws.ping();
      } catch {
        c.terminate();
      }
    }
  }, limits.pingIntervalMs);
  ping.unref();

  async function authorise(req: http.IncomingMessage, url: URL): Promise<{ roomId: string; userId: string; role: Role } | Refusal> {
    const raw = url.pathname.slice(COLLAB_PATH.length);
    let roomId: string;
    try {
      roomId = decodeURIComponent(raw);
    } catch {
      return { code: COLLAB_CLOSE.badMessage, reason: 'the room socket path is /collab/<roomId>' };
    }
    if (!ROOM_ID.test(roomId)) return { code: COLLAB_CLOSE.badMessage, reason: 'the room socket path is /collab/<roomId>' };
    const who = await identifyUser(
      tokens,
      { cookieHeader: req.headers.cookie, token: url.searchParams.get('token') ?? undefined, origin: req.headers.origin, host: req.headers.host },
      config.publicUrl,
    );
    if (!who.ok) return who;
    const access = await authoriseRoom(knex, who, roomId);
    if (!access.ok) return access;
    return { roomId, userId: who.userId, role: access.role };
  }

  async function onCollabUpgrade(req: http.IncomingMessage, socket: Duplex, head: Buffer): Promise<void> {
    socket.on('error', () => socket.destroy());
    const url = new URL(req.url ?? '/', 'http://localhost');
    let outcome: Awaited<ReturnType<typeof authorise>>;
    try {
      outcome = await authorise(req, url);
    } catch (e) {
      logger.error({ err: e }, 'room socket authorisation failed');
      outcome = { code: COLLAB_CLOSE.serverError, reason: 'the server could not check your access; try again' };
    }
    let room: Room | null = null;
    if (closing) outcome = { code: COLLAB_CLOSE.goingAway, reason: 'the server is restarting' };
    else if (!('code' in outcome)) {
      try {
        room = await registry.acquire(outcome.roomId);
      } catch (e) {
        logger.error({ err: e, roomId: outcome.roomId }, 'room document could not be loaded');
        outcome = { code: COLLAB_CLOSE.serverError, reason: 'the room could not be loaded; try again' };
      }
    }
    if (socket.destroyed) {
      room?.release();
      return;
    }
    let upgraded = false;
    socket.once('close', () => {
      if (!upgraded) room?.release();
    });
    wss.handleUpgrade(req, socket, head, (ws) => {
      upgraded = true;
      // Refuse after accepting, so the client sees a 44xx close code and stops retrying.
      if ('code' in outcome) {
        logger.debug({ code: outcome.code, reason: outcome.reason }, 'refused a room socket');
        ws.close(outcome.code, closeReason(outcome.reason));
        return;
      }
      const { roomId, userId, role } = outcome;
      const r = room!;
      if (r.state !== 'open' || closing) {
        r.release();
        ws.close(COLLAB_CLOSE.goingAway, 'the room is unloading; reconnect');
        return;
      }
      const conn = new CollabConnection(ws, userId, role, limits.maxBufferedBytes);
      connections.add(conn);
      conn.whenClosed(() => connections.delete(conn));
      ws.on('message', (data, isBinary) => {
        if (!isBinary) {
          conn.close(COLLAB_CLOSE.badMessage, 'text frames are not part of the protocol');
          return;
        }
        // An exact-size copy: a view into a larger socket buffer would let a bad length read past the message.
        const buf = Array.isArray(data) ? new Uint8Array(Buffer.concat(data)) : new Uint8Array(data);
        r.receive(conn, buf);
      });
      r.attach(conn);
      logger.debug({ roomId, userId, role }, 'room socket open');
      // A role change between the check above and now would be missed: read it once more.
      getRole(knex, roomId, userId).then(
        (now) => {
          if (conn.roleSetByHub || conn.closed) return;
          if (now === null) conn.close(COLLAB_CLOSE.forbidden, 'not a member of this room');
          else conn.role = now;
        },
        () => {},
      );
    });
  }

  const onUpgrade = (req: http.IncomingMessage, socket: Duplex, head: Buffer) => {
    const path = (req.url ?? '').split('?')[0];
    if (path.startsWith(COLLAB_PATH)) {
      void onCollabUpgrade(req, socket, head);
      return;
    }
    if (path.startsWith('/socket.io')) return; // engine.io's own upgrade handler
    // Nobody else answered this upgrade within a second: drop it (as engine.io does by default).
    setTimeout(() => {
      if (!socket.destroyed && (socket as Duplex & { bytesWritten?: number }).bytesWritten === 0) socket.destroy();
    }, 1000).unref();
  };

  function forgetRoom(roomId: string): void {
    const room = registry.get(roomId);
    if (room) void registry.unload(room, { compact: false, closeCode: COLLAB_CLOSE.roomGone, closeReason: 'this room was deleted' });
    roomLog.forgetRoom(roomId);
  }

  // What other processes tell this one: the same rules, applied to the sockets open here.
  cluster?.onControl((message, from) => {
    switch (message.type) {
      case 'role':
        registry.get(message.roomId)?.setRole(message.userId, message.role);
        events.roleChangedElsewhere(message.roomId, message.userId, message.role);
        return;
      case 'room-deleted':
        forgetRoom(message.roomId);
        events.roomDeletedElsewhere(message.roomId);
        return;
      default:
        events.fromCluster(message, from);
    }
  });
  // A process killed between storing an update and publishing it: the others find the row here.
  let catchingUp = false;
  const catchUpTimer = cluster
    ? setInterval(() => {
        if (catchingUp || closing) return;
        catchingUp = true;
        void (async () => {
          for (const room of registry.all())
            await room.catchUpLog().catch((e: unknown) => logger.warn({ roomId: room.id, err: e }, 'could not check a room for updates stored elsewhere'));
        })().finally(() => (catchingUp = false));
      }, CLUSTER_CATCH_UP_MS)
    : null;
  catchUpTimer?.unref();
  cluster?.onResync(() => {
    for (const room of registry.all())
      room.catchUp().catch((e: unknown) => logger.warn({ roomId: room.id, err: e }, 'could not re-read a room after a Redis outage'));
  });

  return {
    attach(httpServer) {
      if (server) throw new Error('the collab hub is already attached');
      server = httpServer;
      httpServer.on('upgrade', onUpgrade);
      events.attach(httpServer);
    },

    roleChanged(roomId, userId, role) {
      registry.get(roomId)?.setRole(userId, role);
      events.roleChanged(roomId, userId, role);
      cluster?.publish({ type: 'role', roomId, userId, role });
    },

    roomDeleted(roomId) {
      forgetRoom(roomId);
      events.roomDeleted(roomId);
      cluster?.publish({ type: 'room-deleted', roomId });
    },

    emit(roomId, event, payload) {
      events.emit(roomId, event, payload);
    },

    async applyUpdate(roomId, update, userId) {
      if (update.byteLength > limits.maxMessageBytes)
        throw new HttpError(
          413,
          'too-large',
          `That change is ${formatBytes(update.byteLength)}; one change to a room may be at most ${formatBytes(limits.maxMessageBytes)}.`,
        );
      if (closing) throw new HttpError(503, 'room-busy', 'The server is restarting. Try again in a moment.');
      const room = await registry.acquire(roomId);
      try {
        await room.applyServerUpdate(update, userId);
      } catch (e) {
        if (e instanceof RoomWriteError)
          throw e.kind === 'too-large'
            ? new HttpError(413, 'too-large', `That change would make the room document too large: ${e.message}.`)
            : new HttpError(503, 'room-busy', `The room did not take the change (${e.message}). Try again in a moment.`);
        throw e;
      } finally {
        room.release();
      }
    },

    async close() {
      if (closing) return;
      closing = true;
      clearInterval(ping);
      if (catchUpTimer) clearInterval(catchUpTimer);
      server?.off('upgrade', onUpgrade);
      await events.close();
      await registry.closeAll();
      for (const c of connections) c.terminate();
      await roomLog.flush();
      await cluster?.close();
      syncWriter?.close();
      await new Promise<void>((resolve) => wss.close(() => resolve()));
      server = null;
    },
  };
}
