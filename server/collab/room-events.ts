/**
 * Room events over socket.io on the application's http server (path `/socket.io`): presence (who is
 * in the room, as what, in which colour, following whom), the room log, role changes, snapshot events
 * and follow mode (a member's `view` is relayed to the members following them, nobody else).
 *
 * The handshake is authorised like the room socket (session cookie, or `auth.token`: a collab token,
 * which limits the socket to its room); `join` checks membership in the database. Every client payload
 * is parsed with the zod schemas of shared/collab/events.ts; a bad one gets an error acknowledgement.
 */
import type http from 'node:http';
import { Server, type Socket } from 'socket.io';
import type { Knex } from 'knex';
import type { Logger } from 'pino';
import type { z } from 'zod';
import type { Role, TokenService } from '../auth/tokens';
import { getRole } from '../rooms/membership';
import { identifyUser, type Identity } from './auth';
import type { CollabLimits } from './limits';
import type { RoomLogWriter } from './room-log';
import type { Cluster, ClusterMember, ClusterMessage } from './cluster';
import {
  followPayloadSchema,
  joinPayloadSchema,
  leavePayloadSchema,
  ROOM_EVENTS,
  viewPayloadSchema,
  type FollowReply,
  type JoinReply,
  type PresenceMember,
  type Reply,
  type ReplyError,
  type RoomLogEntry,
  type ViewState,
} from '../../shared/collab/events';
import { presenceColour } from '../../shared/collab/presence';

interface Member {
  socketId: string;
  userId: string;
  displayName: string;
  role: Role;
  following: string | null;
}

interface SocketData {
  who: Identity & { ok: true };
}

type Ack<T> = (reply: T) => void;

const roomKey = (roomId: string) => `room:${roomId}`;

export interface RoomEventsDeps {
  knex: Knex;
  tokens: TokenService;
  logger: Logger;
  limits: CollabLimits;
  roomLog: RoomLogWriter;
  publicUrl?: string;
  /** Settle the room's edits still waiting to be described, so that the history read next has them. */
  settleLog?: (roomId: string) => void;
  /** Other processes (Redis): socket.io broadcasts through its adapter, presence and views through this. */
  cluster?: Cluster | null;
}

/** Each process repeats its presence lists this often; another process's list not repeated in
 * `PRESENCE_TTL_MS` is dropped (that process is gone). */
const PRESENCE_REPEAT_MS = 10_000;
const PRESENCE_TTL_MS = 35_000;

export class RoomEvents {
  private io: Server | null = null;
  /** roomId -> socketId -> member */
  private readonly rooms = new Map<string, Map<string, Member>>();
  /** roomId -> userId -> that member's latest view */
  private readonly views = new Map<string, Map<string, ViewState>>();
  /** roomId -> processId -> the members connected to that process (other processes only) */
  private readonly remote = new Map<string, Map<string, { members: ClusterMember[]; at: number }>>();
  private repeatTimer: NodeJS.Timeout | null = null;

  constructor(private readonly deps: RoomEventsDeps) {}

  attach(httpServer: http.Server): void {
    const io = new Server(httpServer, {
      path: '/socket.io',
      serveClient: false,
      maxHttpBufferSize: this.deps.limits.maxEventBytes,
      // The room socket at /collab shares the server's upgrade event; engine.io must leave it alone.
      destroyUpgrade: false,
      ...(this.deps.cluster ? { adapter: this.deps.cluster.socketIoAdapter() } : {}),
    });
    io.use((socket, next) => {
      const h = socket.handshake;
      const token = typeof h.auth?.token === 'string' ? h.auth.token : undefined;
      identifyUser(
        this.deps.tokens,
        { cookieHeader: h.headers.cookie, token, origin: h.headers.origin, host: h.headers.host },
        this.deps.publicUrl,
      ).then(
        (who) => {
          if (!who.ok) {
            const err = new Error(who.reason) as Error & { data?: unknown };
            err.data = { code: who.code === 4401 ? 'unauthenticated' : 'forbidden' };
            next(err);
            return;
          }
          (socket.data as SocketData).who = who;
          next();
        },
        (e: unknown) => {
          this.deps.logger.warn({ err: e }, 'room events handshake failed');
          next(new Error('the server could not check your session'));
        },
      );
    });
    io.on('connection', (socket) => this.onConnection(socket));
    this.io = io;
    const cluster = this.deps.cluster;
    if (cluster) {
      cluster.publish({ type: 'presence-query' });
      this.repeatTimer = setInterval(() => {
        for (const roomId of this.rooms.keys()) this.publishPresence(roomId);
        this.expireRemote();
      }, PRESENCE_REPEAT_MS);
      this.repeatTimer.unref();
    }
  }

  // ---- other processes ----

  /** A member's role changed on another process: apply it to the sockets here (the event itself came
   * through the socket.io adapter). */
  roleChangedElsewhere(roomId: string, userId: string, role: Role | null): void {
    this.applyRole(roomId, userId, role);
  }

  roomDeletedElsewhere(roomId: string): void {
    this.rooms.delete(roomId);
    this.views.delete(roomId);
    this.remote.delete(roomId);
  }

  fromCluster(message: ClusterMessage, from: string): void {
    switch (message.type) {
      case 'presence': {
        let byProcess = this.remote.get(message.roomId);
        if (!byProcess) this.remote.set(message.roomId, (byProcess = new Map()));
        if (message.members.length === 0) byProcess.delete(from);
        else byProcess.set(from, { members: message.members, at: Date.now() });
        if (byProcess.size === 0) this.remote.delete(message.roomId);
        this.emitPresenceHere(message.roomId);
        return;
      }
      case 'presence-query':
        for (const roomId of this.rooms.keys()) this.publishPresence(roomId);
        return;
      case 'view': {
        let views = this.views.get(message.roomId);
        if (!views) this.views.set(message.roomId, (views = new Map()));
        views.set(message.userId, message.view);
        this.sendViewHere(message.roomId, message.userId, message.view);
        return;
      }
      default:
        return;
    }
  }

  private publishPresence(roomId: string): void {
    const members = [...(this.rooms.get(roomId)?.values() ?? [])].map((m) => ({ ...m }));
    this.deps.cluster?.publish({ type: 'presence', roomId, members });
  }

  private expireRemote(): void {
    const now = Date.now();
    for (const [roomId, byProcess] of this.remote) {
      let changed = false;
      for (const [pid, entry] of byProcess)
        if (now - entry.at > PRESENCE_TTL_MS) {
          byProcess.delete(pid);
          changed = true;
        }
      if (byProcess.size === 0) this.remote.delete(roomId);
      if (changed) this.emitPresenceHere(roomId);
    }
  }

  private emitPresenceHere(roomId: string): void {
    this.io?.local.to(roomKey(roomId)).emit(ROOM_EVENTS.presence, { roomId, members: this.presence(roomId) });
  }

  /** The members here and on the other processes (fresh lists only). */
  private allMembers(roomId: string): Member[] {
    const out = [...(this.rooms.get(roomId)?.values() ?? [])];
    const now = Date.now();
    for (const entry of this.remote.get(roomId)?.values() ?? []) if (now - entry.at <= PRESENCE_TTL_MS) out.push(...entry.members);
    return out;
  }

  private sendViewHere(roomId: string, userId: string, view: ViewState): void {
    const payload = { roomId, userId, view };
    for (const m of this.rooms.get(roomId)?.values() ?? []) {
      if (m.following === userId && m.userId !== userId) this.io?.sockets.sockets.get(m.socketId)?.emit(ROOM_EVENTS.view, payload);
    }
  }

  emit(roomId: string, event: string, payload: unknown): void {
    if (!this.io) return;
    // Alone, with nobody in the room here, there is nobody to tell (and nothing to encode).
    if (!this.deps.cluster && !this.io.sockets.adapter.rooms.has(roomKey(roomId))) return;
    this.io.to(roomKey(roomId)).emit(event, payload);
  }

  /** Send a room log entry to the room. */
  emitLog(roomId: string, entry: RoomLogEntry): void {
    this.emit(roomId, ROOM_EVENTS.log, entry);
  }

  roleChanged(roomId: string, userId: string, role: Role | null): void {
    this.emit(roomId, ROOM_EVENTS.roleChanged, { roomId, userId, role });
    this.applyRole(roomId, userId, role);
  }

  /** The role change on the sockets of this process. */
  private applyRole(roomId: string, userId: string, role: Role | null): void {
    const members = this.rooms.get(roomId);
    if (!members) return;
    for (const m of [...members.values()]) {
      if (m.userId !== userId) continue;
      if (role === null) {
        const s = this.io?.sockets.sockets.get(m.socketId);
        s?.emit(ROOM_EVENTS.roleChanged, { roomId, userId, role: null });
        s?.leave(roomKey(roomId));
        members.delete(m.socketId);
      } else {
        m.role = role;
      }
    }
    if (role === null) this.views.get(roomId)?.delete(userId);
    this.broadcastPresence(roomId);
  }

  roomDeleted(roomId: string): void {
    this.emit(roomId, ROOM_EVENTS.roomDeleted, { roomId });
    this.io?.in(roomKey(roomId)).socketsLeave(roomKey(roomId));
    this.roomDeletedElsewhere(roomId);
  }

  async close(): Promise<void> {
    const io = this.io;
    this.io = null;
    if (!io) return;
    if (this.repeatTimer) clearInterval(this.repeatTimer);
    this.repeatTimer = null;
    // Tell the other processes that nobody is here any more.
    for (const roomId of this.rooms.keys()) this.deps.cluster?.publish({ type: 'presence', roomId, members: [] });
    io.local.disconnectSockets(true);
    // io.close() would also close the http server, which belongs to the caller.
    io.engine.close();
    io.removeAllListeners();
    this.rooms.clear();
    this.views.clear();
    this.remote.clear();
  }

  // ---- per socket ----

  private onConnection(socket: Socket): void {
    const who = (socket.data as SocketData).who;
    const handle = <S extends z.ZodType, R extends { ok: boolean }>(
      event: string,
      schema: S,
      fn: (payload: z.output<S>) => Promise<R> | R,
    ) => {
      socket.on(event, (raw: unknown, ack: unknown) => {
        const reply: Ack<R | Reply> = typeof ack === 'function' ? (ack as Ack<R | Reply>) : () => {};
        const parsed = schema.safeParse(raw);
        if (!parsed.success) {
          const issue = parsed.error.issues[0];
          reply(failure('bad-request', `bad ${event} payload: ${issue ? `${issue.path.join('.') || 'payload'}: ${issue.message}` : 'invalid'}`));
          return;
        }
        Promise.resolve()
          .then(() => fn(parsed.data))
          .then(reply, (e: unknown) => {
            this.deps.logger.warn({ err: e, event, userId: who.userId }, 'room event failed');
            reply(failure('server-error', 'the server could not handle that; try again'));
          });
      });
    };

    handle(ROOM_EVENTS.join, joinPayloadSchema, ({ roomId }) => this.join(socket, who, roomId));
    handle(ROOM_EVENTS.leave, leavePayloadSchema, ({ roomId }): Reply => {
      this.leave(socket, roomId);
      return { ok: true };
    });
    handle(ROOM_EVENTS.follow, followPayloadSchema, ({ roomId, userId }) => this.follow(socket, roomId, userId));
    handle(ROOM_EVENTS.view, viewPayloadSchema, ({ roomId, view }) => this.view(socket, roomId, view));
    socket.on('disconnect', () => {
      for (const [roomId, members] of this.rooms) if (members.has(socket.id)) this.leave(socket, roomId);
    });
  }

  private async join(socket: Socket, who: Identity & { ok: true }, roomId: string): Promise<JoinReply> {
    if (who.onlyRoomId !== null && who.onlyRoomId !== roomId) return failure('not-a-member', 'your token is for another room');
    const role = await getRole(this.deps.knex, roomId, who.userId);
    if (!role) return failure('not-a-member', 'you are not a member of this room');
    this.deps.settleLog?.(roomId);
    const [displayName, log] = await Promise.all([this.deps.roomLog.displayName(who.userId), this.deps.roomLog.history(roomId)]);
    if (!socket.connected) return failure('server-error', 'disconnected');
    let members = this.rooms.get(roomId);
    if (!members) this.rooms.set(roomId, (members = new Map()));
    const existing = members.get(socket.id);
    members.set(socket.id, { socketId: socket.id, userId: who.userId, displayName, role, following: existing?.following ?? null });
    await socket.join(roomKey(roomId));
    this.broadcastPresence(roomId);
    return { ok: true, roomId, userId: who.userId, role, presence: this.presence(roomId), log };
  }

  private leave(socket: Socket, roomId: string): void {
    const members = this.rooms.get(roomId);
    void socket.leave(roomKey(roomId));
    if (!members?.delete(socket.id)) return;
    if (members.size === 0) {
      this.rooms.delete(roomId);
      if (this.remote.has(roomId)) this.publishPresence(roomId);
      else this.views.delete(roomId);
      return;
    }
    this.broadcastPresence(roomId);
  }

  private follow(socket: Socket, roomId: string, target: string | null): FollowReply {
    const me = this.rooms.get(roomId)?.get(socket.id);
    if (!me) return failure('not-joined', 'join the room first');
    if (target !== null) {
      if (target === me.userId) return failure('bad-request', 'you cannot follow yourself');
      const present = this.allMembers(roomId).some((m) => m.userId === target);
      if (!present) return failure('not-present', 'that member is not in the room now');
    }
    me.following = target;
    this.broadcastPresence(roomId);
    return { ok: true, view: target === null ? null : (this.views.get(roomId)?.get(target) ?? null) };
  }

  private view(socket: Socket, roomId: string, view: ViewState): Reply {
    const members = this.rooms.get(roomId);
    const me = members?.get(socket.id);
    if (!members || !me) return failure('not-joined', 'join the room first');
    let views = this.views.get(roomId);
    if (!views) this.views.set(roomId, (views = new Map()));
    views.set(me.userId, view);
    this.sendViewHere(roomId, me.userId, view);
    this.deps.cluster?.publish({ type: 'view', roomId, userId: me.userId, view });
    return { ok: true };
  }

  /** One entry per person (several tabs count once), in order of arrival. */
  private presence(roomId: string): PresenceMember[] {
    const byUser = new Map<string, PresenceMember>();
    for (const m of this.allMembers(roomId)) {
      const p = byUser.get(m.userId);
      if (p) {
        p.following ??= m.following;
        continue;
      }
      byUser.set(m.userId, { userId: m.userId, displayName: m.displayName, role: m.role, colour: presenceColour(m.userId), following: m.following });
    }
    return [...byUser.values()];
  }

  /** Everyone in the room gets the new list: here directly, on the other processes from their own. */
  private broadcastPresence(roomId: string): void {
    if (!this.deps.cluster) {
      this.emit(roomId, ROOM_EVENTS.presence, { roomId, members: this.presence(roomId) });
      return;
    }
    this.publishPresence(roomId);
    this.emitPresenceHere(roomId);
  }
}

function failure(code: ReplyError['code'], message: string): { ok: false; error: ReplyError } {
  return { ok: false, error: { code, message } };
}
