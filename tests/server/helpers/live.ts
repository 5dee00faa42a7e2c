/**
 * What other people in a room see, for the API tests: a real y-websocket peer on the room socket and a
 * real socket.io client joined to the room's events, both holding a session cookie.
 */
import WebSocket from 'ws';
import * as Y from 'yjs';
import { WebsocketProvider } from 'y-websocket';
import { io, type Socket } from 'socket.io-client';
import { ROOM_EVENTS } from '../../../shared/collab/events';

/** Poll `check` until it returns a value other than undefined/false (or throw after `timeoutMs`). */
export async function waitFor<T>(
  check: () => T | Promise<T>,
  what: string,
  timeoutMs = 8000,
): Promise<Exclude<T, false | undefined>> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const v = await check();
    if (v !== undefined && v !== false) return v as Exclude<T, false | undefined>;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 20));
  }
}

export interface RoomPeer {
  doc: Y.Doc;
  provider: WebsocketProvider;
  synced: Promise<void>;
  destroy(): void;
}

export function roomPeer(baseUrl: string, cookie: string, roomId: string): RoomPeer {
  const doc = new Y.Doc();
  class CookieWebSocket extends WebSocket {
    constructor(url: string, protocols?: string | string[]) {
      super(url, protocols, { headers: { cookie } });
    }
  }
  const provider = new WebsocketProvider(`${baseUrl.replace(/^http/, 'ws')}/collab`, roomId, doc, {
    WebSocketPolyfill: CookieWebSocket as unknown as typeof globalThis.WebSocket,
    disableBc: true,
    maxBackoffTime: 500,
  });
  const synced = new Promise<void>((resolve) => {
    if (provider.synced) resolve();
    provider.on('sync', (s: boolean) => s && resolve());
  });
  return {
    doc,
    provider,
    synced,
    destroy() {
      provider.destroy();
      doc.destroy();
    },
  };
}

export interface RoomListener {
  socket: Socket;
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- payloads are checked field by field
  events: { name: string; payload: any }[];
  /** The first event called `name` (after `from` events) that `match` accepts. */
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  next(name: string, match?: (payload: any) => boolean): Promise<any>;
  close(): void;
}

export async function roomListener(baseUrl: string, cookie: string, roomId: string): Promise<RoomListener> {
  const socket = io(baseUrl, {
    path: '/socket.io',
    transports: ['websocket'],
    forceNew: true,
    reconnection: false,
    extraHeaders: { cookie },
  });
  const events: RoomListener['events'] = [];
  socket.onAny((name: string, payload: unknown) => events.push({ name, payload }));
  await new Promise<void>((resolve, reject) => {
    socket.once('connect', () => resolve());
    socket.once('connect_error', (e) => reject(e));
  });
  const reply = (await socket.emitWithAck(ROOM_EVENTS.join, { roomId })) as { ok: boolean };
  if (!reply.ok) throw new Error(`join failed: ${JSON.stringify(reply)}`);
  return {
    socket,
    events,
    next: (name, match = () => true) =>
      waitFor(() => events.find((e) => e.name === name && match(e.payload))?.payload, `the ${name} event`),
    close: () => socket.close(),
  };
}
