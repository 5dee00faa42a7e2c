/**
 * `npm start` serves the built client; it builds it first when dist/client/index.html is missing or older
 * than any source file of the client (client/, shared/, vite.config.ts).
 */
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import type { Logger } from './logger';

const SKIP_DIRS = new Set(['node_modules', '.git', 'dist']);

/** The newest modification time (ms) of any file under `path` (0 when it does not exist). */
export function newestMtime(path: string): number {
  if (!existsSync(path)) return 0;
  const st = statSync(path);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = 0;
  for (const entry of readdirSync(path, { withFileTypes: true })) {
    if (entry.isDirectory() && SKIP_DIRS.has(entry.name)) continue;
    newest = Math.max(newest, newestMtime(join(path, entry.name)));
  }
  return newest;
}

export function clientBuildIsStale(root = process.cwd()): boolean {
  const index = resolve(root, 'dist/client/index.html');
  if (!existsSync(index)) return true;
  const built = statSync(index).mtimeMs;
  const sources = Math.max(
    ...['client', 'shared', 'vite.config.ts'].map((p) => newestMtime(resolve(root, p))),
  );
  return sources > built;
}

/** Build the client with Vite when stale. Returns true when a build ran. */
export async function ensureClientBuilt(logger: Logger, root = process.cwd()): Promise<boolean> {
  if (!existsSync(resolve(root, 'client/index.html'))) {
    logger.warn('client/index.html not found: serving the API only');
    return false;
  }
  if (!clientBuildIsStale(root)) return false;
  logger.info('building the client (dist/client is missing or older than its sources)...');
  const started = Date.now();
  const { build } = await import('vite');
  await build({ configFile: resolve(root, 'vite.config.ts'), logLevel: 'warn' });
  logger.info({ ms: Date.now() - started }, 'client built');
  return true;
}
