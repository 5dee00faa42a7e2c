/**
 * `npm run dev`: the API on API_PORT (default 3001), restarted by `tsx watch` on server changes, and Vite's
 * dev server (vite.config.ts proxies /api, /collab and /socket.io to API_PORT) with hot reload.
 */
import { spawn } from 'node:child_process';
import { resolve } from 'node:path';
import { createServer } from 'vite';

const apiPort = process.env.API_PORT || '3001';

const api = spawn(
  resolve('node_modules/.bin/tsx'),
  ['watch', '--clear-screen=false', 'server/start.ts', '--api-only'],
  {
    stdio: 'inherit',
    env: {
      ...process.env,
      PORT: apiPort,
      API_PORT: apiPort,
      NODE_ENV: process.env.NODE_ENV || 'development',
    },
  },
);

const vite = await createServer({
  configFile: resolve('vite.config.ts'),
  server: { port: Number(process.env.VITE_PORT || process.env.PORT || 5173) },
});
await vite.listen();
vite.printUrls();
process.stdout.write(`  API: http://localhost:${apiPort}/api (proxied by Vite)\n`);

let stopping = false;
async function stop(): Promise<void> {
  if (stopping) return;
  stopping = true;
  api.kill('SIGTERM');
  await vite.close();
  process.exit(0);
}
process.on('SIGINT', () => void stop());
process.on('SIGTERM', () => void stop());
api.on('exit', (code) => {
  if (!stopping) {
    process.stderr.write(`matchloom dev: the API process exited (${code}); stopping\n`);
    void stop();
  }
});
