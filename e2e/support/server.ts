/**
 * The real Matchloom server for a browser test: started in-process on a free port of 127.0.0.1, with a
 * fresh SQLite file in its own temp folder, serving the built client from dist/client. Call `close()`
 * in `afterAll`; it stops the server and deletes the folder.
 */
import { existsSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { loadConfig } from '../../server/config';
import { startServer, type RunningServer } from '../../server/main';

export const CLIENT_DIR = resolve('dist/client');

export interface TestServer {
  /** e.g. http://127.0.0.1:41237 */
  url: string;
  server: RunningServer;
  databaseFile: string;
  close(): Promise<void>;
}

export interface TestServerOptions {
  /** seed the demo accounts and rooms (default false: an empty database). */
  seedDemo?: boolean;
  /** extra environment for loadConfig (wins over the defaults below). */
  env?: Record<string, string>;
}

export async function startTestServer({ seedDemo = false, env = {} }: TestServerOptions = {}): Promise<TestServer> {
  if (!existsSync(join(CLIENT_DIR, 'index.html')))
    throw new Error(`No built client in ${CLIENT_DIR}: run the browser tests with "npm run test:e2e", which builds it first.`);
  const dir = await mkdtemp(join(tmpdir(), 'matchloom-e2e-'));
  const databaseFile = join(dir, 'matchloom.sqlite3');
  const config = loadConfig({
    ...process.env,
    PORT: '0',
    HOST: '127.0.0.1',
    DATABASE_FILE: databaseFile,
    SEED_DEMO: seedDemo ? '1' : '0',
    NODE_ENV: 'test',
    LOG_LEVEL: process.env.LOG_LEVEL ?? 'silent',
    // Fewer bcrypt rounds keep sign-ups quick; the cost itself is checked by the server's own tests.
    BCRYPT_COST: '4',
    ...env,
  });
  let server: RunningServer;
  try {
    server = await startServer(config, { clientDir: CLIENT_DIR });
  } catch (error) {
    await rm(dir, { recursive: true, force: true });
    throw error;
  }
  return {
    url: server.url,
    server,
    databaseFile,
    async close() {
      await server.close();
      await rm(dir, { recursive: true, force: true });
    },
  };
}
