// One server process for the collab benchmark. `matchloom`: the real server (startServer) on a temp
// SQLite file. `bare`: a plain y-websocket server (@y/websocket-server setupWSConnection; no auth, no
// persistence). Prints {"port": n}; answers IPC "stats" with its CPU time and memory (after a GC);
// with BENCH_PROFILE set, IPC "profile-resume" / "profile-pause" bracket a CPU profile written there
// (sampled every BENCH_PROFILE_INTERVAL_US µs, default 100; 400 distorts the timings less).
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { mkdirSync, writeFileSync } from 'node:fs';
import { Session } from 'node:inspector/promises';
import { join } from 'node:path';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { WebSocketServer } from 'ws';
import { setupWSConnection } from '@y/websocket-server/utils';
import { startServer } from '../../server/main';
import { testConfig } from '../collab/helpers/world';

const mode = process.argv[2];

async function start(): Promise<number> {
  if (mode === 'matchloom') {
    const file = process.env.DATABASE_FILE;
    if (!file) throw new Error('DATABASE_FILE is required');
    const server = await startServer(testConfig(file), { clientDir: null });
    return server.port;
  }
  const server = http.createServer((_req, res) => res.writeHead(404).end());
  const wss = new WebSocketServer({ noServer: true });
  server.on('upgrade', (req, socket, head) => {
    const docName = (req.url ?? '/').split('?')[0].replace(/^\/collab\//, '');
    wss.handleUpgrade(req, socket, head, (ws) => setupWSConnection(ws, req, { docName }));
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return (server.address() as AddressInfo).port;
}

const port = await start();
const loopDelay = monitorEventLoopDelay({ resolution: 5 });
loopDelay.enable();
// With BENCH_PROFILE=<dir>, the main thread's CPU profile of the measuring windows only (no set-up).
const profiler = process.env.BENCH_PROFILE ? new Session() : null;
if (profiler) {
  mkdirSync(process.env.BENCH_PROFILE!, { recursive: true });
  profiler.connect();
  await profiler.post('Profiler.enable');
  await profiler.post('Profiler.setSamplingInterval', { interval: Number(process.env.BENCH_PROFILE_INTERVAL_US ?? 100) });
}
let profiling = false;
process.on('message', async (msg) => {
  if (profiler && msg === 'profile-resume' && !profiling) {
    profiling = true;
    await profiler.post('Profiler.start');
  }
  if (profiler && msg === 'profile-pause' && profiling) {
    profiling = false;
    const { profile } = await profiler.post('Profiler.stop');
    writeFileSync(join(process.env.BENCH_PROFILE!, `${mode}-${Date.now()}.cpuprofile`), JSON.stringify(profile));
  }
  if (msg !== 'stats') return;
  (globalThis as { gc?: () => void }).gc?.();
  // The longest event-loop stall since the last call (ms): a sign of blocking work in the server.
  const maxLoopDelayMs = loopDelay.max / 1e6;
  loopDelay.reset();
  process.send?.({ cpu: process.cpuUsage(), mem: process.memoryUsage(), at: performance.now(), maxLoopDelayMs });
});
process.stdout.write(`${JSON.stringify({ port })}\n`);
process.on('SIGTERM', () => process.exit(0));
