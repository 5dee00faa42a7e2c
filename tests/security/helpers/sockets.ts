/**
 * Both sockets, from the outside: the room socket (`/collab/<roomId>`, y-websocket protocol over ws) and
 * socket.io (`/socket.io`). Each helper resolves with what the server did: the close code and reason, or
 * whether socket.io accepted the connection or refused it with an error.
 */
import WebSocket from 'ws';
import { io } from 'socket.io-client';

export interface RoomSocketOutcome {
  /** true when the server sent anything before closing (a sync step 1 means it served the room). */
  gotMessages: number;
  code: number;
  reason: string;
}

/** Open `/collab/<roomId>` with the given cookie / token / origin and wait for the server to close it. */
export function roomSocket(
  wsBase: string,
  roomId: string,
  o: { cookie?: string; token?: string; origin?: string; timeoutMs?: number } = {},
): Promise<RoomSocketOutcome> {
  const q = o.token !== undefined ? `?token=${encodeURIComponent(o.token)}` : '';
  const headers: Record<string, string> = {};
  if (o.cookie) headers.cookie = o.cookie;
  if (o.origin) headers.origin = o.origin;
  return new Promise((resolve, reject) => {
    const ws = new WebSocket(`${wsBase}/collab/${encodeURIComponent(roomId)}${q}`, { headers });
    let gotMessages = 0;
    const timer = setTimeout(() => {
      ws.terminate();
      resolve({ gotMessages, code: -1, reason: 'still open' });
    }, o.timeoutMs ?? 1500);
    ws.on('message', () => {
      gotMessages += 1;
    });
    ws.on('close', (code, reason) => {
      clearTimeout(timer);
      resolve({ gotMessages, code, reason: reason.toString('utf8') });
    });
    ws.on('unexpected-response', (_req, res) => {
      clearTimeout(timer);
      resolve({ gotMessages, code: -(res.statusCode ?? 0), reason: `HTTP ${res.statusCode}` });
    });
    ws.on('error', (e) => {
      if (ws.readyState === WebSocket.CLOSED) return;
      clearTimeout(timer);
      reject(e);
    });
  });
}

export interface EventsOutcome {
  connected: boolean;
  /** The connect_error message, when refused. */
  error?: string;
  data?: unknown;
}

/** Connect socket.io with the given credentials; resolves on connect or on connect_error (no retries). */
export function eventsSocket(
  baseUrl: string,
  o: { cookie?: string; token?: string; origin?: string; transport?: 'websocket' | 'polling'; timeoutMs?: number } = {},
): Promise<EventsOutcome> {
  const extraHeaders: Record<string, string> = {};
  if (o.cookie) extraHeaders.cookie = o.cookie;
  if (o.origin) extraHeaders.origin = o.origin;
  const socket = io(baseUrl, {
    path: '/socket.io',
    transports: [o.transport ?? 'websocket'],
    reconnection: false,
    forceNew: true,
    timeout: o.timeoutMs ?? 3000,
    auth: o.token !== undefined ? { token: o.token } : {},
    extraHeaders,
  });
  return new Promise((resolve) => {
    socket.on('connect', () => {
      socket.disconnect();
      resolve({ connected: true });
    });
    socket.on('connect_error', (err: Error & { data?: unknown }) => {
      socket.disconnect();
      resolve({ connected: false, error: err.message, data: err.data });
    });
  });
}
