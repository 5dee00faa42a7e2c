/**
 * A `RoomUpdateSink` that hands a server-side edit to the collab hub the way a browser does: it opens the
 * room socket of this very server (`/collab/<roomId>`, with a collab token for the acting member), sends
 * the update as a y-websocket update message, and waits until the hub has stored it. The hub then does
 * what it does for every edit: checks the role, stores, applies to the live document, broadcasts to
 * every open client and writes the room log entry, attributed to that member.
 *
 * This is used while the hub offers no direct way to apply a server-side update; `main.ts` prefers the
 * hub's own `applyUpdate` when it has one.
 */
import WebSocket from 'ws';
import type { Knex } from 'knex';
import * as encoding from 'lib0/encoding';
import * as syncProtocol from 'y-protocols/sync';
import type { TokenService } from '../auth/tokens';
import { HttpError } from '../errors';
import { getRole } from './membership';
import { storeHasUpdate, type RoomUpdateSink } from './document-edit';
import { DEFAULT_LIMITS, formatBytes } from '../collab/limits';

const MESSAGE_SYNC = 0;
const POLL_MS = 15;

export interface LoopbackSinkDeps {
  knex: Knex;
  tokens: TokenService;
  /** This server's own address (http://127.0.0.1:port), known once it listens. */
  baseUrl: () => string;
  /** How long to wait for the hub to store the update (default 10 s). */
  timeoutMs?: number;
  /** The hub's largest accepted room-socket message (default: the hub's default). */
  maxMessageBytes?: number;
}

const roomBusy = (why: string) =>
  new HttpError(503, 'room-busy', `The room did not take the change (${why}). Try again in a moment.`);

function updateMessage(update: Uint8Array): Uint8Array {
  const e = encoding.createEncoder();
  encoding.writeVarUint(e, MESSAGE_SYNC);
  syncProtocol.writeUpdate(e, update);
  return encoding.toUint8Array(e);
}

export function loopbackRoomSink(deps: LoopbackSinkDeps): RoomUpdateSink {
  const timeoutMs = deps.timeoutMs ?? 10_000;
  const maxBytes = deps.maxMessageBytes ?? DEFAULT_LIMITS.maxMessageBytes;

  return {
    async applyUpdate(roomId, update, userId) {
      if (!userId) throw new Error('a server-side room edit needs the member who makes it');
      const message = updateMessage(update);
      if (message.byteLength > maxBytes)
        throw new HttpError(
          413,
          'too-large',
          `That change is ${formatBytes(message.byteLength)}; one change to a room may be at most ${formatBytes(maxBytes)}.`,
        );
      const role = await getRole(deps.knex, roomId, userId);
      if (!role) throw new HttpError(404, 'not-found', 'Room not found.');
      const token = await deps.tokens.signCollab({ userId, roomId, role });
      const url = `${deps.baseUrl().replace(/^http/, 'ws')}/collab/${encodeURIComponent(roomId)}?token=${encodeURIComponent(token)}`;

      const ws = new WebSocket(url, { perMessageDeflate: false });
      const deadline = Date.now() + timeoutMs;
      let closed: { code: number; reason: string } | null = null;
      ws.on('close', (code, reason) => (closed = { code, reason: reason.toString() }));
      ws.on('error', () => undefined);
      try {
        // The hub's first message (its sync step 1) means the socket is attached to the loaded room.
        await new Promise<void>((resolve, reject) => {
          const timer = setTimeout(() => reject(roomBusy('the room socket did not open in time')), timeoutMs);
          ws.once('message', () => {
            clearTimeout(timer);
            resolve();
          });
          ws.once('close', (code, reason) => {
            clearTimeout(timer);
            reject(roomBusy(`the room socket closed: ${code} ${reason.toString() || ''}`.trim()));
          });
        });
        await new Promise<void>((resolve, reject) =>
          ws.send(message, (err) => (err ? reject(err) : resolve())),
        );
        // Stored before it is broadcast: once the store holds it, every open client has it or is getting it.
        for (;;) {
          if (await storeHasUpdate(deps.knex, roomId, update)) return;
          const c = closed as { code: number; reason: string } | null;
          if (c) throw roomBusy(`the room socket closed: ${c.code} ${c.reason}`.trim());
          if (Date.now() > deadline) throw roomBusy('it was not stored in time');
          await new Promise((r) => setTimeout(r, POLL_MS));
        }
      } finally {
        if (ws.readyState === WebSocket.OPEN || ws.readyState === WebSocket.CONNECTING)
          ws.close(1000, 'done');
      }
    },
  };
}
