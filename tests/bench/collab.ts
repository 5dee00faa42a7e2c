/**
 * Collaboration benchmark (`npm run bench:collab`; not a test). On loopback, one server process at a
 * time, real y-websocket providers in this process: the time from an edit on one client to its arrival
 * on each other client (p50, p95), for
 *   - one room of 2, 20 and 100 clients (up to 4 of them editing, 5 edits a second each), and
 *   - 50 rooms of 3 clients, every client editing 5 times a second,
 * with the server's CPU and memory per room, against a bare y-websocket server (@y/websocket-server
 * setupWSConnection: no auth, no persistence, no roles) measured in the same run, scenario by scenario.
 * Targets: p95 < 25 ms with 20 clients, no disconnects, Matchloom p95 ≤ 1.3 × bare.
 *
 *   npm run bench:collab               # about 2.5 minutes
 *   BENCH_SECONDS=3 npm run bench:collab
 *   BENCH_ONLY="50 rooms" BENCH_PROFILE=/tmp/prof npm run bench:collab   # one scenario; CPU profiles of
 *                                       # each server's measuring windows (not the set-up) in /tmp/prof
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { rmSync } from 'node:fs';
import { loadavg } from 'node:os';
import { join } from 'node:path';
import { createInterface } from 'node:readline';
import WebSocket from 'ws';
import * as Y from 'yjs';
import { WebsocketProvider } from 'y-websocket';
import { designMap, setElementField, writeDesign } from '../../shared/collab/schema';
import type { Element } from '../../shared/rf/design';
import { Api, designWith, tempDir, type Person } from '../collab/helpers/world';

/** Seconds of edits per server per scenario (in 1 s windows, alternating with the other server). */
const SECONDS = Number(process.env.BENCH_SECONDS ?? 10);
const RATE_HZ = 5;
/**
 * Clients join over this span, as people do, not in one instant. Every y-websocket client renews its
 * presence 15 s after its last renewal, checking every 3 s from when it was made, and (y-websocket 3.x)
 * sends back every presence update it receives; 100 clients made in the same millisecond renew in one
 * burst, which this process, holding all of them, takes as a 200-300 ms stall that lands in whichever
 * server's window is running (seen with both servers). Spread over one check period, renewals are spread too.
 */
const JOIN_SPREAD_MS = 3000;

interface Scenario {
  name: string;
  rooms: number;
  clientsPerRoom: number;
  editorsPerRoom: number;
}

const ALL_SCENARIOS: Scenario[] = [
  { name: '1 room × 2 clients', rooms: 1, clientsPerRoom: 2, editorsPerRoom: 2 },
  { name: '1 room × 20 clients', rooms: 1, clientsPerRoom: 20, editorsPerRoom: 4 },
  { name: '1 room × 100 clients', rooms: 1, clientsPerRoom: 100, editorsPerRoom: 4 },
  { name: '50 rooms × 3 clients', rooms: 50, clientsPerRoom: 3, editorsPerRoom: 3 },
];
/** BENCH_ONLY=100 runs only the scenarios whose name contains "100". */
const SCENARIOS = ALL_SCENARIOS.filter((s) => !process.env.BENCH_ONLY || s.name.includes(process.env.BENCH_ONLY));
// Each y-websocket provider adds a process 'exit' listener.
process.setMaxListeners(0);

interface Stats {
  cpu: NodeJS.CpuUsage;
  mem: NodeJS.MemoryUsage;
  at: number;
  maxLoopDelayMs: number;
}

interface ServerProc {
  child: ChildProcess;
  port: number;
  stats(): Promise<Stats>;
  stop(): Promise<void>;
}

async function startServerProcess(mode: 'matchloom' | 'bare', databaseFile: string): Promise<ServerProc> {
  const script = join(process.cwd(), 'tests', 'bench', 'collab-server.ts');
  const child = spawn(process.execPath, ['--expose-gc', '--import', 'tsx', script, mode], {
    env: { ...process.env, DATABASE_FILE: databaseFile, LOG_LEVEL: 'silent' },
    stdio: ['ignore', 'pipe', 'inherit', 'ipc'],
  });
  const port = await new Promise<number>((resolve, reject) => {
    createInterface({ input: child.stdout! }).once('line', (l) => resolve(JSON.parse(l).port));
    child.once('exit', (code) => reject(new Error(`${mode} server exited with ${code}`)));
  });
  let stopping = false;
  // A server that dies mid-run would leave the bench waiting for its figures.
  child.once('exit', (code, signal) => {
    if (stopping) return;
    console.error(`the ${mode} server exited during the run (${signal ?? `code ${code}`})`);
    process.exit(1);
  });
  return {
    child,
    port,
    stats: () =>
      new Promise<Stats>((resolve) => {
        child.once('message', (m) => resolve(m as Stats));
        child.send('stats');
      }),
    stop: () =>
      new Promise<void>((resolve) => {
        stopping = true;
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
        setTimeout(() => child.kill('SIGKILL'), 3000).unref();
      }),
  };
}

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
}

interface Result {
  p50: number;
  p95: number;
  samples: number;
  disconnects: number;
  cpuPerRoomPct: number;
  memPerRoomKiB: number;
  maxLoopDelayMs: number;
}

const elementsFor = (editors: number): Element[] => Array.from({ length: editors }, (_, i) => ({ id: `e${i}`, kind: 'shunt-c', value: 1e-12 }));

/** One server's rooms and clients for a scenario, connected; edits run only inside `window`. */
interface Setup {
  window(ms: number): Promise<void>;
  /** Forget what the windows so far measured (after a warm-up window). */
  reset(): void;
  finish(): Promise<Result>;
}

async function setUp(mode: 'matchloom' | 'bare', s: Scenario, proc: ServerProc, api: Api, people: { owner: Person; watcher: Person }): Promise<Setup> {
  // Rooms: created through the API for Matchloom; for the bare server the first client writes the design.
  const roomIds: string[] = [];
  for (let r = 0; r < s.rooms; r++) {
    if (mode === 'matchloom') {
      const id = await api.createRoom(people.owner, designWith(elementsFor(s.editorsPerRoom)));
      await api.addMember(people.owner, id, people.watcher, 'observer');
      roomIds.push(id);
    } else roomIds.push(`bare-${s.rooms}-${s.clientsPerRoom}-${r}-${Date.now()}`);
  }
  const before = await proc.stats();
  const sent = new Map<string, number>();
  const latencies: number[] = [];
  let disconnects = 0;
  let measuring = false;
  const providers: WebsocketProvider[] = [];

  const total = s.rooms * s.clientsPerRoom;
  const clients = await Promise.all(
    roomIds.flatMap((roomId, r) =>
      Array.from({ length: s.clientsPerRoom }, async (_, c) => {
        await new Promise((res) => setTimeout(res, ((r * s.clientsPerRoom + c) / total) * JOIN_SPREAD_MS));
        const editor = c < s.editorsPerRoom;
        const person = editor ? people.owner : people.watcher;
        const cookie = mode === 'matchloom' ? person.cookie : '';
        class CookieWS extends WebSocket {
          constructor(url: string, protocols?: string | string[]) {
            super(url, protocols, { headers: cookie ? { cookie } : {} });
          }
        }
        const doc = new Y.Doc();
        const provider = new WebsocketProvider(`ws://127.0.0.1:${proc.port}/collab`, roomId, doc, {
          WebSocketPolyfill: CookieWS as unknown as typeof globalThis.WebSocket,
          disableBc: true,
        });
        providers.push(provider);
        provider.on('connection-close', () => {
          if (measuring) disconnects++;
        });
        await new Promise<void>((resolve) => (provider.synced ? resolve() : provider.once('sync', () => resolve())));
        designMap(doc).observeDeep((events, txn) => {
          if (txn.origin !== provider) return;
          const now = performance.now();
          for (const ev of events) {
            const target = ev.target;
            if (!(target instanceof Y.Map) || !(ev as Y.YMapEvent<unknown>).keysChanged.has('value')) continue;
            const t = sent.get(`${r}:${target._item?.parentSub}:${target.get('value')}`);
            if (t !== undefined) latencies.push(now - t);
          }
        });
        return { r, c, doc, editor };
      }),
    ),
  );
  if (mode === 'bare')
    for (const cl of clients) if (cl.c === 0) writeDesign(cl.doc, designWith(elementsFor(s.editorsPerRoom)));
  await new Promise((res) => setTimeout(res, 800));
  const loaded = await proc.stats();
  let cpuMs = 0;
  let wallMs = 0;
  let maxLoopDelayMs = 0;
  let seq = 0;

  return {
    // Each editor edits its own element's value (a sequence number) RATE_HZ times a second, staggered.
    async window(ms) {
      measuring = true;
      const t0 = await proc.stats();
      if (process.env.BENCH_PROFILE) proc.child.send('profile-resume');
      const timers: NodeJS.Timeout[] = [];
      for (const cl of clients.filter((x) => x.editor)) {
        const edit = () => {
          seq += 1;
          sent.set(`${cl.r}:e${cl.c}:${seq}`, performance.now());
          setElementField(cl.doc, `e${cl.c}`, 'value', seq);
        };
        timers.push(
          setTimeout(
            () => {
              edit();
              timers.push(setInterval(edit, 1000 / RATE_HZ));
            },
            Math.random() * (1000 / RATE_HZ),
          ),
        );
      }
      await new Promise((res) => setTimeout(res, ms));
      for (const t of timers) clearTimeout(t);
      await new Promise((res) => setTimeout(res, 300)); // stragglers
      if (process.env.BENCH_PROFILE) proc.child.send('profile-pause');
      const t1 = await proc.stats();
      measuring = false;
      cpuMs += (t1.cpu.user - t0.cpu.user + t1.cpu.system - t0.cpu.system) / 1000;
      wallMs += t1.at - t0.at;
      maxLoopDelayMs = Math.max(maxLoopDelayMs, t1.maxLoopDelayMs);
    },
    reset() {
      latencies.length = 0;
      cpuMs = 0;
      wallMs = 0;
      maxLoopDelayMs = 0;
    },
    async finish() {
      for (const p of providers) p.destroy();
      for (const cl of clients) cl.doc.destroy();
      await new Promise((res) => setTimeout(res, 300));
      latencies.sort((a, b) => a - b);
      return {
        p50: percentile(latencies, 50),
        p95: percentile(latencies, 95),
        samples: latencies.length,
        disconnects,
        cpuPerRoomPct: (100 * cpuMs) / wallMs / s.rooms,
        memPerRoomKiB: (loaded.mem.heapUsed + loaded.mem.external - before.mem.heapUsed - before.mem.external) / 1024 / s.rooms,
        maxLoopDelayMs,
      };
    },
  };
}

async function main(): Promise<void> {
  const dir = tempDir('matchloom-bench-');
  const rows: { scenario: Scenario; ours: Result; bare: Result }[] = [];
  const started = Date.now();
  try {
    const ours = await startServerProcess('matchloom', join(dir, 'bench.sqlite3'));
    const bare = await startServerProcess('bare', join(dir, 'unused.sqlite3'));
    const api = new Api(`http://127.0.0.1:${ours.port}`);
    const people = { owner: await api.signUp('Bench Owner'), watcher: await api.signUp('Bench Watcher') };
    for (const s of SCENARIOS) {
      // Both sets of clients stay connected; the edits alternate between them in short windows, so a
      // busy machine slows both alike.
      const b = await setUp('bare', s, bare, api, people);
      const o = await setUp('matchloom', s, ours, api, people);
      const windowMs = 1000;
      // One unmeasured window each first: the first edits of a scenario also warm up this process's new
      // providers and the server's code paths (p95 two to four times the rest's, for whichever ran first).
      await b.window(windowMs);
      await o.window(windowMs);
      b.reset();
      o.reset();
      for (let i = 0; i < Math.max(1, Math.round(SECONDS)); i++) {
        await b.window(windowMs);
        await o.window(windowMs);
      }
      rows.push({ scenario: s, ours: await o.finish(), bare: await b.finish() });
      process.stdout.write(`${s.name}: done\n`);
    }
    await ours.stop();
    await bare.stop();
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }

  const f = (n: number, d = 1) => (Number.isFinite(n) ? n.toFixed(d) : '—');
  const lines = [
    `Collab benchmark: ${SECONDS} s per scenario, ${RATE_HZ} edits/s per editor, loopback, one server process (${((Date.now() - started) / 1000).toFixed(0)} s in all; machine load average ${loadavg().map((x) => x.toFixed(1)).join(' ')})`,
    '',
    '| scenario | editors/room | Matchloom p50 / p95 (ms) | bare p50 / p95 (ms) | p95 ratio | samples | disconnects | server CPU per room | server memory per room | longest server stall (ms) |',
    '| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |',
    ...rows.map(
      ({ scenario: s, ours: o, bare: b }) =>
        `| ${s.name} | ${s.editorsPerRoom} | ${f(o.p50)} / ${f(o.p95)} | ${f(b.p50)} / ${f(b.p95)} | ${f(o.p95 / b.p95, 2)} | ${o.samples} / ${b.samples} | ${o.disconnects} / ${b.disconnects} | ${f(o.cpuPerRoomPct, 2)} % / ${f(b.cpuPerRoomPct, 2)} % | ${f(o.memPerRoomKiB, 0)} KiB / ${f(b.memPerRoomKiB, 0)} KiB | ${f(o.maxLoopDelayMs, 0)} / ${f(b.maxLoopDelayMs, 0)} |`,
    ),
    '',
  ];
  const r20 = rows.find((r) => r.scenario.clientsPerRoom === 20);
  // null: not measured in this run (BENCH_ONLY left the scenario out).
  const checks: [string, boolean | null][] = [
    ['p95 < 25 ms with 20 clients', r20 === undefined ? null : r20.ours.p95 < 25],
    ['no disconnects', rows.every((r) => r.ours.disconnects === 0)],
    ['p95 ≤ 1.3 × bare in every scenario run', rows.every((r) => r.ours.p95 <= 1.3 * r.bare.p95)],
  ];
  for (const [what, ok] of checks) lines.push(`${ok === null ? 'not measured' : ok ? 'met' : 'NOT met'}: ${what}`);
  process.stdout.write(`${lines.join('\n')}\n`);
}

await main();
