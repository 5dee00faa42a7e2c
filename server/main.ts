/**
 * Start everything on one http server: migrate, seed (unless SEED_DEMO=0), the API, the built client,
 * the room socket and socket.io. Used by start.ts, dev mode, the API tests and the browser tests.
 */
import http from 'node:http';
import type { Duplex } from 'node:stream';
import type { AddressInfo } from 'node:net';
import type { Knex } from 'knex';
import type { Config } from './config';
import { createLogger, type Logger } from './logger';
import { createKnex, migrateLatest } from './db';
import { createTokenService } from './auth/tokens';
import { createPasswordHasher } from './auth/passwords';
import { createApp } from './app';
import { DEFAULT_CLIENT_DIR } from './static';
import { createCollabHub } from './collab/index';
import { connectCluster, redactRedisUrl, type Cluster } from './collab/cluster';
import { seedDemo } from '../db/seeds/demo';
import { findUserByEmail } from './services/users';
import { DEMO_USERS } from '../shared/demo/designs';
import { createMailer, type Mailer } from './mail/mailer';
import type { RoomUpdateSink } from './rooms/document-edit';
import { loopbackRoomSink } from './rooms/loopback-sink';

export interface RunningServer {
  url: string;
  port: number;
  httpServer: http.Server;
  knex: Knex;
  close(): Promise<void>;
}

export interface StartOptions {
  logger?: Logger;
  /** the built client to serve; default dist/client when it has an index.html; null for the API only. */
  clientDir?: string | null;
}

/** How long open connections may take to finish before they are cut at shutdown. */
const CLOSE_GRACE_MS = 5000;

/** The hub's own way to apply a server-side document update, when it has one. */
function hubUpdateSink(hub: object): RoomUpdateSink | null {
  const apply = (hub as Partial<RoomUpdateSink>).applyUpdate;
  return typeof apply === 'function' ? { applyUpdate: apply.bind(hub) } : null;
}

/** An address on this machine that reaches a server listening on `host`. */
function loopbackHost(host: string): string {
  if (host === '0.0.0.0' || host === '') return '127.0.0.1';
  if (host === '::') return '[::1]';
  return host.includes(':') ? `[${host}]` : host;
}

export async function startServer(config: Config, options: StartOptions = {}): Promise<RunningServer> {
  const logger = options.logger ?? createLogger(config);
  const knex = createKnex(config.databaseFile, config.databaseUrl);
  let ready = false;
  let demoAccounts = false;
  let mailer: Mailer | undefined;
  let cluster: Cluster | null = null;
  try {
    const applied = await migrateLatest(knex);
    if (applied.length) logger.info({ applied }, 'database migrated');
    if (config.seedDemo) {
      const { created } = await seedDemo(knex, { bcryptCost: config.bcryptCost });
      if (created) logger.info('demo rooms and accounts created');
    }
    demoAccounts =
      config.nodeEnv !== 'production' && (await findUserByEmail(knex, DEMO_USERS[0].email)) !== null;
    mailer = await createMailer(config, logger);
    if (config.redisUrl) {
      cluster = await connectCluster(config.redisUrl, logger);
      logger.info({ redis: redactRedisUrl(config.redisUrl) }, 'in step with other processes through Redis');
    }
  } catch (e) {
    await mailer?.close().catch(() => undefined);
    await knex.destroy();
    throw e;
  }

  const tokens = createTokenService(config.jwtSecret);
  const hub = createCollabHub({ knex, tokens, logger, config, cluster });
  let selfUrl = '';
  const roomUpdates = hubUpdateSink(hub) ?? loopbackRoomSink({ knex, tokens, baseUrl: () => selfUrl });
  const app = createApp({
    config,
    knex,
    tokens,
    logger,
    passwords: createPasswordHasher(config.bcryptCost),
    events: hub,
    mailer,
    roomUpdates,
    isReady: () => ready,
    demoAccounts: () => demoAccounts,
    clientDir: options.clientDir === undefined ? DEFAULT_CLIENT_DIR : options.clientDir,
  });
  const httpServer = http.createServer(app);
  httpServer.on('clientError', answerClientError);
  hub.attach(httpServer);

  try {
    await new Promise<void>((resolve, reject) => {
      httpServer.once('error', reject);
      httpServer.listen(config.port, config.host, () => {
        httpServer.off('error', reject);
        resolve();
      });
    });
  } catch (e) {
    await hub.close().catch(() => undefined);
    await mailer.close().catch(() => undefined);
    await knex.destroy();
    throw e;
  }
  ready = true;
  const port = (httpServer.address() as AddressInfo).port;
  selfUrl = `http://${loopbackHost(config.host)}:${port}`;
  const shownHost = config.host === '0.0.0.0' || config.host === '::' ? 'localhost' : config.host;
  const url = `http://${shownHost.includes(':') ? `[${shownHost}]` : shownHost}:${port}`;
  logger.info({ url }, 'matchloom listening');

  let closing: Promise<void> | undefined;
  const close = () =>
    (closing ??= (async () => {
      ready = false;
      const closed = new Promise<void>((resolve) => httpServer.close(() => resolve()));
      httpServer.closeIdleConnections();
      await hub.close().catch((err) => logger.warn({ err }, 'collab hub did not close cleanly'));
      const timer = setTimeout(() => httpServer.closeAllConnections(), CLOSE_GRACE_MS);
      timer.unref();
      await closed;
      clearTimeout(timer);
      await mailer.close().catch((err) => logger.warn({ err }, 'the mailer did not close cleanly'));
      await knex.destroy();
      logger.info('matchloom stopped');
    })());

  return { url, port, httpServer, knex, close };
}

/**
 * A request Node could not parse (a malformed request line, a raw non-ASCII path, headers over the size
 * limit): answered in the API's error shape rather than Node's bare status line, then closed.
 */
function answerClientError(err: NodeJS.ErrnoException, socket: Duplex): void {
  if (err.code === 'ECONNRESET' || !socket.writable) {
    socket.destroy();
    return;
  }
  const tooLarge = err.code === 'HPE_HEADER_OVERFLOW';
  const status = tooLarge ? 431 : 400;
  const body = JSON.stringify({
    error: tooLarge
      ? { code: 'headers-too-large', message: 'The request headers are too large.' }
      : { code: 'bad-request', message: 'The request could not be read (malformed request line or headers).' },
  });
  socket.end(
    `HTTP/1.1 ${status} ${http.STATUS_CODES[status]}\r\nContent-Type: application/json; charset=utf-8\r\n` +
      `Content-Length: ${Buffer.byteLength(body)}\r\nConnection: close\r\n\r\n${body}`,
  );
}
