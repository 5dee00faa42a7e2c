/**
 * The real Matchloom server for a browser test: started in-process on a free port of 127.0.0.1, with a
 * fresh SQLite file in its own temp folder, serving a copy of the built client (dist/client). Call
 * `close()` in `afterAll`; it stops the server and deletes the folder.
 */
import { existsSync } from 'node:fs';
import { cp, mkdtemp, readFile, rm } from 'node:fs/promises';
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

/** The files index.html loads (`/assets/index-abc.js`, ...), as paths under the client folder. */
async function assetsOf(clientDir: string): Promise<string[]> {
  const html = await readFile(join(clientDir, 'index.html'), 'utf8');
  return [...html.matchAll(/(?:src|href)="\/(assets\/[^"]+)"/g)].map((m) => m[1]);
}

/**
 * Copies the built client (without source maps) so that a build started meanwhile in the same
 * checkout (another engineer's, say) cannot swap the files under a running test. A copy caught
 * half-way through such a build is detected (index.html names a missing file) and taken again.
 */
async function copyClient(target: string): Promise<void> {
  for (let attempt = 1; ; attempt++) {
    await rm(target, { recursive: true, force: true });
    await cp(CLIENT_DIR, target, { recursive: true, filter: (source) => !source.endsWith('.map') });
    const complete = existsSync(join(target, 'index.html')) && (await assetsOf(target)).every((asset) => existsSync(join(target, asset)));
    if (complete) return;
    if (attempt === 5) throw new Error(`The built client in ${CLIENT_DIR} kept changing while it was copied: is another build running?`);
    await new Promise((resolve) => setTimeout(resolve, 2000));
  }
}

export async function startTestServer({ seedDemo = false, env = {} }: TestServerOptions = {}): Promise<TestServer> {
  if (!existsSync(join(CLIENT_DIR, 'index.html')))
    throw new Error(`No built client in ${CLIENT_DIR}: run the browser tests with "npm run test:e2e", which builds it first.`);
  const dir = await mkdtemp(join(tmpdir(), 'matchloom-e2e-'));
  const databaseFile = join(dir, 'matchloom.sqlite3');
  const clientDir = join(dir, 'client');
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
    await copyClient(clientDir);
    server = await startServer(config, { clientDir });
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
