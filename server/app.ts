/**
 * The Express application: security headers, request logs, the JSON API under /api, and the built
 * client. Everything it needs is passed in (no module globals, no process.env).
 */
import express from 'express';
import cookieParser from 'cookie-parser';
import { pinoHttp } from 'pino-http';
import type { Knex } from 'knex';
import type { Config } from './config';
import type { Logger } from './logger';
import type { Role, TokenService } from './auth/tokens';
import type { PasswordHasher } from './auth/passwords';
import { sessionMiddleware } from './auth/session';
import { originCheck } from './auth/origin';
import { apiNotFound, errorHandler } from './errors';
import { healthRoutes } from './routes/health';
import { authRoutes } from './routes/auth';
import { roomRoutes } from './routes/rooms';
import { memberRoutes } from './routes/members';
import { snapshotRoutes } from './routes/snapshots';
import { handoffRoutes } from './handoff/routes';
import { noteRoutes } from './routes/notes';
import { uploadRoutes } from './routes/uploads';
import { lineageRoutes } from './routes/lineage';
import { invitationRoutes } from './routes/invitations';
import { devMailboxRoutes } from './routes/dev-mailbox';
import type { Mailer } from './mail/mailer';
import type { RoomUpdateSink } from './rooms/document-edit';
import { clientRoutes } from './static';
import { securityMiddleware } from './security/index';

/** The part of the collab hub that routes call when rooms change. */
export interface RoomEvents {
  roleChanged(roomId: string, userId: string, role: Role | null): void;
  roomDeleted(roomId: string): void;
  emit(roomId: string, event: string, payload: unknown): void;
}

export interface AppDeps {
  config: Config;
  knex: Knex;
  tokens: TokenService;
  logger: Logger;
  passwords: PasswordHasher;
  events: RoomEvents;
  /** Outgoing mail (invitations, review requests). */
  mailer: Mailer;
  /** Stores a server-side edit of a room document and applies it to the live room. */
  roomUpdates: RoomUpdateSink;
  /** true once migrated and listening, false again while shutting down. */
  isReady: () => boolean;
  /** true when the demo accounts exist and this is not production (health then says `demo: true`). */
  demoAccounts: () => boolean;
  /** the built client to serve, or null for the API only. */
  clientDir: string | null;
}

/** Largest JSON body: a design with an embedded Touchstone measurement fits comfortably. */
export const JSON_BODY_LIMIT = '2mb';

/** A request URL fit for the log: invitation links and `token=` values are secrets. */
export function redactUrl(url: string): string {
  return url
    .replace(/(\/invitations\/)[^/?#]+/g, '$1[redacted]')
    .replace(/([?&]token=)[^&#]*/g, '$1[redacted]');
}

export function createApp(deps: AppDeps): express.Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');

  app.use(securityMiddleware(deps.config)); // headers, CSP, no-store on /api, rate limits (server/security)

  app.use(
    pinoHttp({
      logger: deps.logger,
      autoLogging: { ignore: (req) => req.url === '/api/health' },
      customLogLevel: (_req, res, err) =>
        err || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'info' : 'debug',
      serializers: {
        req: (req: { method: string; url: string; id: unknown }) => ({
          id: req.id,
          method: req.method,
          url: redactUrl(req.url),
        }),
      },
    }),
  );

  const api = express.Router();
  api.use(healthRoutes(deps.isReady, deps.demoAccounts));
  api.use(express.json({ limit: JSON_BODY_LIMIT }));
  api.use(cookieParser());
  api.use(
    originCheck({
      publicUrl: deps.config.publicUrl,
      allowLoopbackOrigins: deps.config.nodeEnv === 'development',
    }),
  );
  api.use(sessionMiddleware(deps));
  api.use(authRoutes(deps));
  api.use(roomRoutes(deps));
  api.use(memberRoutes(deps));
  api.use(snapshotRoutes(deps));
  api.use(handoffRoutes(deps));
  api.use(noteRoutes(deps));
  api.use(uploadRoutes(deps));
  api.use(lineageRoutes(deps));
  api.use(invitationRoutes(deps));
  if (deps.config.nodeEnv !== 'production') api.use(devMailboxRoutes(deps));
  api.use(apiNotFound);
  app.use('/api', api);

  const client = deps.clientDir ? clientRoutes(deps.clientDir) : null;
  if (client) app.use(client);

  app.use((_req, res) => {
    res.status(404).json({ error: { code: 'not-found', message: 'Not found.' } });
  });
  app.use(errorHandler(deps.logger));
  return app;
}
