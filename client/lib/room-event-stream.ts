/**
 * The team features' window on a room's socket.io events (`/socket.io`, authorised by the session
 * cookie; shared/collab/events.ts and team-events.ts name the events). One connection per room and
 * tab, shared by every panel that listens (reference-counted, closed when the last one leaves); it
 * joins the room on every (re)connect and tells listeners, so they can catch up on what they missed.
 *
 * The payloads are checked by each listener with the shared zod schemas; nothing here trusts them.
 */
import { createContext } from 'react';
import { io, type Socket } from 'socket.io-client';
import { ROOM_EVENTS, type JoinReply } from '../../shared/collab/events';

export type RoomEventListener = (event: string, payload: unknown) => void;
export type RoomStreamStatus = 'connecting' | 'live' | 'offline';

interface Stream {
  socket: Socket;
  /** Set while the last listener has gone: the stream closes unless another comes soon. */
  closing: ReturnType<typeof setTimeout> | null;
  listeners: Set<RoomEventListener>;
  statusListeners: Set<(status: RoomStreamStatus) => void>;
  status: RoomStreamStatus;
}

/** Fired (as an event name) after each successful join, the first one included. */
export const STREAM_JOINED = 'stream:joined';

export type SocketFactory = () => Socket;

const defaultFactory: SocketFactory = () =>
  io({ path: '/socket.io', withCredentials: true, transports: ['websocket', 'polling'], reconnectionDelayMax: 10_000 });

/**
 * `lingerMs`: how long a stream stays open after its last listener leaves, so that moving between a
 * room's pages (snapshots, notes, ...) keeps one connection instead of reconnecting.
 */
export function createRoomEventStreams(factory: SocketFactory = defaultFactory, { lingerMs = 3000 }: { lingerMs?: number } = {}) {
  const streams = new Map<string, Stream>();

  const setStatus = (stream: Stream, status: RoomStreamStatus) => {
    if (stream.status === status) return;
    stream.status = status;
    stream.statusListeners.forEach((listener) => listener(status));
  };

  function open(roomId: string): Stream {
    const socket = factory();
    const stream: Stream = { socket, closing: null, listeners: new Set(), statusListeners: new Set(), status: 'connecting' };
    socket.on('connect', () => {
      socket.emit(ROOM_EVENTS.join, { roomId }, (reply: JoinReply) => {
        if (!reply?.ok) {
          setStatus(stream, 'offline');
          return;
        }
        setStatus(stream, 'live');
        stream.listeners.forEach((listener) => listener(STREAM_JOINED, { roomId }));
      });
    });
    socket.on('disconnect', () => setStatus(stream, 'offline'));
    socket.on('connect_error', () => setStatus(stream, 'offline'));
    socket.onAny((event: string, payload: unknown) => {
      stream.listeners.forEach((listener) => listener(event, payload));
    });
    streams.set(roomId, stream);
    return stream;
  }

  function close(roomId: string, stream: Stream) {
    streams.delete(roomId);
    if (stream.socket.connected) stream.socket.emit(ROOM_EVENTS.leave, { roomId }, () => undefined);
    stream.socket.removeAllListeners();
    stream.socket.offAny();
    stream.socket.disconnect();
  }

  return {
    /** Listen to a room's events; returns the function that stops listening. */
    subscribe(roomId: string, listener: RoomEventListener, onStatus?: (status: RoomStreamStatus) => void): () => void {
      const stream = streams.get(roomId) ?? open(roomId);
      if (stream.closing) {
        clearTimeout(stream.closing);
        stream.closing = null;
      }
      stream.listeners.add(listener);
      if (onStatus) {
        stream.statusListeners.add(onStatus);
        onStatus(stream.status);
      }
      // Joined already (another panel opened the stream): this listener catches up too.
      if (stream.status === 'live') queueMicrotask(() => stream.listeners.has(listener) && listener(STREAM_JOINED, { roomId }));
      return () => {
        stream.listeners.delete(listener);
        if (onStatus) stream.statusListeners.delete(onStatus);
        if (stream.listeners.size > 0 || streams.get(roomId) !== stream || stream.closing) return;
        stream.closing = setTimeout(() => {
          stream.closing = null;
          if (stream.listeners.size === 0 && streams.get(roomId) === stream) close(roomId, stream);
        }, lingerMs);
      };
    },
  };
}

export type RoomEventStreams = ReturnType<typeof createRoomEventStreams>;

let shared: RoomEventStreams | null = null;

/** The app's one set of room streams (created on first use, so tests and pages without it open nothing). */
export function roomEventStreams(): RoomEventStreams {
  shared ??= createRoomEventStreams();
  return shared;
}

/** Where a subtree gets its streams (tests give their own); without a provider, the app's shared ones. */
export const RoomEventStreamsContext = createContext<RoomEventStreams | null>(null);
