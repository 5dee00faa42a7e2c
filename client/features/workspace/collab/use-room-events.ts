/**
 * The room's event socket (socket.io at `/socket.io`, cookie-authorised): who is in the room, the
 * room log, role changes, and the view relay that follow mode rides on. Event names and payload
 * shapes come from shared/collab/events; every payload from the server is checked before use.
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import { io, type Socket } from 'socket.io-client';
import {
  ROOM_EVENTS,
  presencePayloadSchema,
  roleChangedPayloadSchema,
  roomDeletedPayloadSchema,
  roomLogEntrySchema,
  viewRelayPayloadSchema,
  type FollowReply,
  type JoinReply,
  type PresenceMember,
  type RoomLogEntry,
  type RoomRole,
  type ViewState,
} from '../../../../shared/collab/events';

export interface RoomEvents {
  connected: boolean;
  members: PresenceMember[];
  /** newest first */
  log: RoomLogEntry[];
  /** the role the server last told us we have in this room (null: removed) */
  roleUpdate: { role: RoomRole | null } | null;
  deleted: boolean;
  /** the view of the member we follow, as last relayed */
  followedView: { userId: string; view: ViewState } | null;
  follow(userId: string | null): void;
  sendView(view: ViewState): void;
}

export const ROOM_LOG_LIMIT = 200;

/** Adds or replaces (same id: a merged run of edits) a log entry, newest first. */
export function mergeLogEntry(log: readonly RoomLogEntry[], entry: RoomLogEntry, limit = ROOM_LOG_LIMIT): RoomLogEntry[] {
  const rest = log.filter((e) => e.id !== entry.id);
  return [entry, ...rest].sort((a, b) => b.at - a.at || b.id - a.id).slice(0, limit);
}

const VIEW_INTERVAL_MS = 150;

export function useRoomEvents(roomId: string, myUserId: string | null): RoomEvents {
  const [connected, setConnected] = useState(false);
  const [members, setMembers] = useState<PresenceMember[]>([]);
  const [log, setLog] = useState<RoomLogEntry[]>([]);
  const [roleUpdate, setRoleUpdate] = useState<{ role: RoomRole | null } | null>(null);
  const [deleted, setDeleted] = useState(false);
  const [followedView, setFollowedView] = useState<{ userId: string; view: ViewState } | null>(null);
  const socketRef = useRef<Socket | null>(null);
  const followingRef = useRef<string | null>(null);
  const viewTimer = useRef<{ timer: ReturnType<typeof setTimeout> | null; pending: ViewState | null; last: number }>({
    timer: null,
    pending: null,
    last: 0,
  });
  const me = useRef(myUserId);
  me.current = myUserId;

  useEffect(() => {
    const socket = io({ path: '/socket.io', withCredentials: true, transports: ['websocket', 'polling'] });
    socketRef.current = socket;

    const join = () => {
      socket.emit(ROOM_EVENTS.join, { roomId }, (reply: JoinReply) => {
        if (!reply || !reply.ok) return;
        setMembers(reply.presence);
        setLog([...reply.log].sort((a, b) => b.at - a.at || b.id - a.id).slice(0, ROOM_LOG_LIMIT));
        const f = followingRef.current;
        if (f) socket.emit(ROOM_EVENTS.follow, { roomId, userId: f }, () => undefined);
      });
    };
    socket.on('connect', () => {
      setConnected(true);
      join();
    });
    socket.on('disconnect', () => setConnected(false));
    socket.on(ROOM_EVENTS.presence, (raw: unknown) => {
      const p = presencePayloadSchema.safeParse(raw);
      if (p.success && p.data.roomId === roomId) setMembers(p.data.members);
    });
    socket.on(ROOM_EVENTS.log, (raw: unknown) => {
      const p = roomLogEntrySchema.safeParse(raw);
      if (p.success && p.data.roomId === roomId) setLog((l) => mergeLogEntry(l, p.data));
    });
    socket.on(ROOM_EVENTS.roleChanged, (raw: unknown) => {
      const p = roleChangedPayloadSchema.safeParse(raw);
      if (p.success && p.data.roomId === roomId && p.data.userId === me.current) setRoleUpdate({ role: p.data.role });
    });
    socket.on(ROOM_EVENTS.roomDeleted, (raw: unknown) => {
      const p = roomDeletedPayloadSchema.safeParse(raw);
      if (p.success && p.data.roomId === roomId) setDeleted(true);
    });
    socket.on(ROOM_EVENTS.view, (raw: unknown) => {
      const p = viewRelayPayloadSchema.safeParse(raw);
      if (p.success && p.data.roomId === roomId && p.data.userId === followingRef.current)
        setFollowedView({ userId: p.data.userId, view: p.data.view });
    });

    const timers = viewTimer.current;
    return () => {
      if (timers.timer) clearTimeout(timers.timer);
      socket.emit(ROOM_EVENTS.leave, { roomId }, () => undefined);
      socket.removeAllListeners();
      socket.disconnect();
      socketRef.current = null;
    };
  }, [roomId]);

  const follow = useCallback(
    (userId: string | null) => {
      followingRef.current = userId;
      setFollowedView(null);
      const socket = socketRef.current;
      if (!socket?.connected) return;
      socket.emit(ROOM_EVENTS.follow, { roomId, userId }, (reply: FollowReply) => {
        if (reply?.ok && reply.view && followingRef.current === userId && userId) setFollowedView({ userId, view: reply.view });
      });
    },
    [roomId],
  );

  const sendView = useCallback(
    (view: ViewState) => {
      const t = viewTimer.current;
      t.pending = view;
      if (t.timer) return;
      const flush = () => {
        t.timer = null;
        t.last = Date.now();
        const socket = socketRef.current;
        if (socket?.connected && t.pending) socket.emit(ROOM_EVENTS.view, { roomId, view: t.pending }, () => undefined);
        t.pending = null;
      };
      const wait = VIEW_INTERVAL_MS - (Date.now() - t.last);
      if (wait <= 0) flush();
      else t.timer = setTimeout(flush, wait);
    },
    [roomId],
  );

  return { connected, members, log, roleUpdate, deleted, followedView, follow, sendView };
}
