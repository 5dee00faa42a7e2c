/**
 * The collaboration hub: the Yjs room socket at `/collab/<roomId>` and the socket.io room events, on
 * the application's http server. The server engineer wires it in `server/main.ts`:
 *
 *   const hub = createCollabHub({ knex, tokens, logger, config }); hub.attach(httpServer);
 *   // after a role change or removal:  hub.roleChanged(roomId, userId, role | null)
 *   // after a room is deleted:         hub.roomDeleted(roomId)
 *   // after a snapshot is created:     hub.emit(roomId, ROOM_EVENTS.snapshotCreated, payload)
 *   // on shutdown:                     await hub.close()
 */
import type http from 'node:http';
import type { Knex } from 'knex';
import type { Logger } from 'pino';
import type { Config } from '../config';
import type { Role, TokenService } from '../auth/tokens';

export interface CollabHub {
  /** Handle `/collab/<roomId>` upgrades and mount socket.io at `/socket.io` on this server. */
  attach(httpServer: http.Server): void;
  /** A member's role changed (`null`: removed). Takes effect at once on open sockets. */
  roleChanged(roomId: string, userId: string, role: Role | null): void;
  /** The room is gone: disconnect everyone in it and forget its document. */
  roomDeleted(roomId: string): void;
  /** Send a room event (e.g. snapshot-created) to every socket.io client in the room. */
  emit(roomId: string, event: string, payload: unknown): void;
  /** Flush every loaded document to storage, close all sockets. */
  close(): Promise<void>;
}

export interface CollabDeps {
  knex: Knex;
  tokens: TokenService;
  logger: Logger;
  config: Config;
}

export function createCollabHub(deps: CollabDeps): CollabHub {
  const { logger } = deps;
  let server: http.Server | undefined;
  return {
    attach(httpServer) {
      server = httpServer;
      logger.debug('collab hub attached (thin: socket handling not yet wired)');
    },
    roleChanged() {},
    roomDeleted() {},
    emit() {},
    async close() {
      server = undefined;
    },
  };
}
