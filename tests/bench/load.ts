/**
 * Load benchmark (`npm run bench:load`; not a test). Loopback only, about two to three minutes.
 *
 * Starts the real server (`server/start.ts --api-only`, production settings, demo data seeded, a temp
 * SQLite file) in a child process so its memory (/proc/<pid>/status VmRSS) and CPU time
 * (/proc/<pid>/stat utime + stime) can be read, then:
 *
 *  1. HTTP: autocannon against the main read routes (health, room list, a room's design, its snapshots)
 *     with a session cookie, at 1, 10, 50 and 100 connections, to see where one process saturates;
 *  2. sockets: ROOMS rooms × 4 people, each with a y-websocket provider and a socket.io client joined
 *     to the room, each person editing their own element at 2 Hz for EDIT_SECONDS; edit propagation
 *     latency is measured at every other client of the room.
 *
 * Prints tables of throughput, latency p50 / p97.5 / p99, errors (must be zero), disconnects, server RSS
 * and CPU, and exits 1 if any request failed or a socket dropped. The load generator runs on the same
 * machine (two cores shared with the server): the figures are a floor, not a ceiling.
 *
 * Knobs (environment): BENCH_SECONDS (per HTTP run, default 5), ROOMS (default 18), EDIT_SECONDS (20).
 * Each room's owner adds three members through the API, and the production invitation brake allows 60
 * additions per client address per 15 minutes: 18 rooms (54 additions) is the most one run can set up.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import WebSocket from 'ws';
import * as Y from 'yjs';
import { WebsocketProvider } from 'y-websocket';
import { io, type Socket } from 'socket.io-client';
import { setElementField, readElement } from '../../shared/collab/schema';
import { DEMO_PASSWORD, DEMO_USERS } from '../../shared/demo/designs';
import { ROOM_EVENTS } from '../../shared/collab/events';
import type { DesignInput } from '../../shared/rf/design';

// ---- autocannon (no type declarations ship with it) ----

interface Histogram {
  average: number;
  p50: number;
  p97_5: number;
  p99: number;
  max: number;
}
interface AutocannonResult {
  requests: Histogram & { total: number };
  latency: Histogram;
  throughput: Histogram;
  errors: number;
  timeouts: number;
  non2xx: number;
  duration: number;
}
type Autocannon = (opts: {
  url: string;
  connections: number;
  duration: number;
  headers?: Record<string, string>;
  pipelining?: number;
}) => Promise<AutocannonResult>;
const autocannon = createRequire(import.meta.url)('autocannon') as Autocannon;

// ---- settings ----

const HTTP_SECONDS = Number(process.env.BENCH_SECONDS ?? 5);
const CONNECTIONS = [1, 10, 50, 100];
const ROOMS = Number(process.env.ROOMS ?? 18);
const PEOPLE_PER_ROOM = 4;
const EDIT_HZ = 2;
const EDIT_SECONDS = Number(process.env.EDIT_SECONDS ?? 20);
const CLK_TCK = 100; // Linux USER_HZ

// ---- the server process and its /proc figures ----

interface ServerProc {
  child: ChildProcess;
  url: string;
  pid: number;
}

function cpuTicks(pid: number): number {
  const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  return Number(fields[11]) + Number(fields[12]); // utime, stime (fields 14 and 15 of the line)
}

function rssMb(pid: number): number {
  const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return m ? Number(m[1]) / 1024 : NaN;
}

/** CPU share (% of one core) and peak RSS of the server while `fn` runs. */
async function measured<T>(pid: number, fn: () => Promise<T>): Promise<{ value: T; cpuPercent: number; generatorCpuPercent: number; peakRssMb: number; endRssMb: number }> {
  const t0 = performance.now();
  const c0 = cpuTicks(pid);
  const g0 = process.cpuUsage();
  let peak = rssMb(pid);
  const timer = setInterval(() => {
    peak = Math.max(peak, rssMb(pid));
  }, 200);
  try {
    const value = await fn();
    const seconds = (performance.now() - t0) / 1000;
    const cpuPercent = ((cpuTicks(pid) - c0) / CLK_TCK / seconds) * 100;
    const g = process.cpuUsage(g0);
    const generatorCpuPercent = ((g.user + g.system) / 1e6 / seconds) * 100;
    const end = rssMb(pid);
    return { value, cpuPercent, generatorCpuPercent, peakRssMb: Math.max(peak, end), endRssMb: end };
  } finally {
    clearInterval(timer);
  }
}

async function startServerProcess(dir: string): Promise<ServerProc> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/start.ts', '--api-only'], {
    env: {
      ...process.env,
      NODE_ENV: 'production',
      JWT_SECRET: randomBytes(32).toString('base64url'),
      HOST: '127.0.0.1',
      PORT: '0',
      DATABASE_FILE: join(dir, 'load.sqlite3'),
      SEED_DEMO: '1',
      LOG_LEVEL: 'info',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let errText = '';
  child.stderr!.on('data', (d: Buffer) => (errText += d.toString()));
  const url = await new Promise<string>((resolve, reject) => {
    let buf = '';
    const timer = setTimeout(() => reject(new Error(`the server did not start in 60 s: ${errText}`)), 60_000);
    child.stdout!.on('data', (d: Buffer) => {
      buf += d.toString();
      let nl: number;
      while ((nl = buf.indexOf('\n')) >= 0) {
        const line = buf.slice(0, nl);
        buf = buf.slice(nl + 1);
        try {
          const entry = JSON.parse(line) as { msg?: string; url?: string; level?: number };
          if (entry.msg === 'matchloom listening' && entry.url) {
            clearTimeout(timer);
            resolve(entry.url.replace('localhost', '127.0.0.1'));
          } else if ((entry.level ?? 0) >= 50) process.stderr.write(`server: ${line}\n`);
        } catch {
          /* not a log line */
        }
      }
    });
    child.once('exit', (code) => reject(new Error(`the server exited (${code}): ${errText}`)));
  });
  return { child, url, pid: child.pid! };
}

async function stopServerProcess(p: ServerProc): Promise<void> {
  if (p.child.exitCode !== null) return;
  const exited = new Promise<void>((resolve) => p.child.once('exit', () => resolve()));
  p.child.kill('SIGTERM');
  const timer = setTimeout(() => p.child.kill('SIGKILL'), 15_000);
  await exited;
  clearTimeout(timer);
}

// ---- API helpers ----

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- JSON answers, checked where used
async function call(base: string, cookie: string | null, method: string, path: string, body?: unknown): Promise<{ status: number; body: any; setCookie: string[] }> {
  const res = await fetch(base + path, {
    method,
    headers: { 'content-type': 'application/json', ...(cookie ? { cookie } : {}) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await res.text();
  return { status: res.status, body: text ? JSON.parse(text) : null, setCookie: res.headers.getSetCookie() };
}

function cookieFrom(setCookie: string[]): string {
  const c = setCookie.find((v) => v.startsWith('ml_session='));
  if (!c) throw new Error('no session cookie');
  return c.split(';')[0];
}

async function must<T>(p: Promise<{ status: number; body: T }>, status: number, what: string): Promise<T> {
  const r = await p;
  if (r.status !== status) throw new Error(`${what}: expected ${status}, got ${r.status} ${JSON.stringify(r.body)}`);
  return r.body;
}

function benchDesign(ids: string[]): DesignInput {
  return {
    format: 'matchloom-design',
    version: 1,
    name: 'Load bench design',
    referenceOhms: 50,
    load: { kind: 'rlc', topology: 'series', r: 12, l: 1.5e-9, c: 2e-12 },
    band: { startHz: 2.4e9, stopHz: 2.4835e9 },
    sweep: { startHz: 2e9, stopHz: 2.9e9, points: 201 },
    goal: { maxVswr: 2 },
    elements: ids.map((id, i) => ({ id, kind: i % 2 ? 'shunt-c' : 'series-l', value: i % 2 ? 1e-12 : 2e-9 })),
  };
}

// ---- statistics and tables ----

function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
}

function table(headers: string[], rows: (string | number)[][]): string {
  const cells = rows.map((r) => r.map((c) => (typeof c === 'number' ? (Number.isInteger(c) ? String(c) : c.toFixed(1)) : c)));
  const widths = headers.map((h, i) => Math.max(h.length, ...cells.map((r) => r[i].length)));
  const line = (r: string[]) => `| ${r.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join(' | ')} |`;
  return [line(headers), `|${widths.map((w) => '-'.repeat(w + 2)).join('|')}|`, ...cells.map(line)].join('\n');
}

// ---- phase 1: HTTP ----

interface HttpRow {
  route: string;
  connections: number;
  result: AutocannonResult;
  cpuPercent: number;
  generatorCpuPercent: number;
  peakRssMb: number;
}

async function httpPhase(server: ServerProc, cookie: string, roomId: string): Promise<HttpRow[]> {
  const routes = ['/api/health', '/api/rooms', `/api/rooms/${roomId}/design`, `/api/rooms/${roomId}/snapshots`];
  const rows: HttpRow[] = [];
  for (const route of routes) {
    for (const connections of CONNECTIONS) {
      const m = await measured(server.pid, () =>
        autocannon({ url: server.url + route, connections, duration: HTTP_SECONDS, headers: { cookie } }),
      );
      const shown = route.replace(roomId, ':id');
      rows.push({ route: shown, connections, result: m.value, cpuPercent: m.cpuPercent, generatorCpuPercent: m.generatorCpuPercent, peakRssMb: m.peakRssMb });
      process.stderr.write(`  ${shown} × ${connections}: ${m.value.requests.average.toFixed(0)} req/s\n`);
    }
  }
  return rows;
}

// ---- phase 2: sockets ----

interface Client {
  person: number;
  roomId: string;
  elementId: string;
  doc: Y.Doc;
  provider: WebsocketProvider;
  events: Socket;
  lastSeen: Map<string, unknown>;
}

interface SocketFigures {
  clients: number;
  rooms: number;
  editsSent: number;
  deliveriesExpected: number;
  deliveries: number;
  latencies: number[];
  providerCloses: number;
  eventDisconnects: number;
  joinFailures: number;
  syncMs: number;
  roomLogEvents: number;
  presenceEvents: number;
}

async function socketPhase(server: ServerProc, cookies: string[]): Promise<{ figures: SocketFigures; cpuPercent: number; generatorCpuPercent: number; peakRssMb: number; endRssMb: number; setupRssMb: number; loadAverage: string }> {
  const wsBase = server.url.replace(/^http/, 'ws');
  const ownerCookie = cookies[0];
  const emails = await Promise.all(cookies.map(async (c) => (await must(call(server.url, c, 'GET', '/api/me'), 200, 'me')).email as string));
  const elementIds = Array.from({ length: PEOPLE_PER_ROOM }, (_, i) => `el${i}`);
  const roomIds: string[] = [];
  for (let r = 0; r < ROOMS; r++) {
    const room = await must(call(server.url, ownerCookie, 'POST', '/api/rooms', { name: `Load room ${r + 1}`, design: benchDesign(elementIds) }), 201, 'create room');
    for (let p = 1; p < PEOPLE_PER_ROOM; p++)
      await must(call(server.url, ownerCookie, 'POST', `/api/rooms/${room.id}/members`, { email: emails[p], role: 'tuner' }), 201, 'add member');
    roomIds.push(room.id as string);
  }

  const sent = new Map<number, number>(); // value -> time sent
  const figures: SocketFigures = {
    clients: ROOMS * PEOPLE_PER_ROOM,
    rooms: ROOMS,
    editsSent: 0,
    deliveriesExpected: 0,
    deliveries: 0,
    latencies: [],
    providerCloses: 0,
    eventDisconnects: 0,
    joinFailures: 0,
    syncMs: 0,
    roomLogEvents: 0,
    presenceEvents: 0,
  };
  let editing = false;
  const clients: Client[] = [];
  const t0 = performance.now();
  for (const roomId of roomIds) {
    for (let p = 0; p < PEOPLE_PER_ROOM; p++) {
      const headers = { cookie: cookies[p] };
      class CookieWebSocket extends WebSocket {
        constructor(url: string, protocols?: string | string[]) {
          super(url, protocols, { headers });
        }
      }
      const doc = new Y.Doc();
      const provider = new WebsocketProvider(`${wsBase}/collab`, roomId, doc, {
        WebSocketPolyfill: CookieWebSocket as unknown as typeof globalThis.WebSocket,
        disableBc: true,
        maxBackoffTime: 1000,
      });
      provider.on('connection-close', () => {
        if (editing) figures.providerCloses++;
      });
      const events = io(server.url, { path: '/socket.io', transports: ['websocket'], extraHeaders: headers, reconnection: true });
      events.on('disconnect', () => {
        if (editing) figures.eventDisconnects++;
      });
      events.on(ROOM_EVENTS.log, () => figures.roomLogEvents++);
      events.on(ROOM_EVENTS.presence, () => figures.presenceEvents++);
      const client: Client = { person: p, roomId, elementId: elementIds[p], doc, provider, events, lastSeen: new Map() };
      doc.on('update', () => {
        if (!editing) return;
        const now = performance.now();
        for (const id of elementIds) {
          if (id === client.elementId) continue;
          const v = readElement(doc, id)?.value;
          if (v === undefined || client.lastSeen.get(id) === v) continue;
          client.lastSeen.set(id, v);
          const at = sent.get(v as number);
          if (at !== undefined) {
            figures.deliveries++;
            figures.latencies.push(now - at);
          }
        }
      });
      clients.push(client);
    }
  }
  // Everyone synced and joined.
  await Promise.all(
    clients.map(
      (c) =>
        new Promise<void>((resolve, reject) => {
          const timer = setTimeout(() => reject(new Error('a client did not sync within 60 s')), 60_000);
          const done = () => {
            clearTimeout(timer);
            resolve();
          };
          if (c.provider.synced) done();
          else c.provider.on('sync', (s: boolean) => s && done());
        }),
    ),
  );
  await Promise.all(
    clients.map(async (c) => {
      if (!c.events.connected) await new Promise<void>((resolve) => c.events.once('connect', () => resolve()));
      const reply = (await c.events.timeout(10_000).emitWithAck(ROOM_EVENTS.join, { roomId: c.roomId })) as { ok: boolean };
      if (!reply.ok) figures.joinFailures++;
    }),
  );
  figures.syncMs = performance.now() - t0;
  const setupRssMb = rssMb(server.pid);
  for (const c of clients) for (const id of elementIds) c.lastSeen.set(id, readElement(c.doc, id)?.value);

  let seq = 0;
  const m = await measured(server.pid, async () => {
    editing = true;
    const periodMs = 1000 / EDIT_HZ;
    const timers = clients.map((c, i) => {
      let ticker: NodeJS.Timeout | undefined;
      // Spread the clients over the period so the edits do not arrive in one burst.
      const start = setTimeout(() => {
        ticker = setInterval(() => {
          seq += 1;
          const base = c.person % 2 ? 1e-12 : 2e-9;
          const value = base * (1 + seq / 1e5);
          sent.set(value, performance.now());
          setElementField(c.doc, c.elementId, 'value', value);
          figures.editsSent++;
          figures.deliveriesExpected += PEOPLE_PER_ROOM - 1;
        }, periodMs);
      }, (i / clients.length) * periodMs);
      return () => {
        clearTimeout(start);
        if (ticker) clearInterval(ticker);
      };
    });
    await new Promise((r) => setTimeout(r, EDIT_SECONDS * 1000));
    for (const stop of timers) stop();
    // Let the last edits arrive.
    const deadline = performance.now() + 10_000;
    while (figures.deliveries < figures.deliveriesExpected && performance.now() < deadline) await new Promise((r) => setTimeout(r, 100));
    editing = false;
  });
  for (const c of clients) {
    c.events.disconnect();
    c.provider.destroy();
    c.doc.destroy();
  }
  return { figures, cpuPercent: m.cpuPercent, generatorCpuPercent: m.generatorCpuPercent, peakRssMb: m.peakRssMb, endRssMb: m.endRssMb, setupRssMb, loadAverage: loadavg()[0].toFixed(1) };
}

// ---- main ----

async function main(): Promise<void> {
  // Each of the 400 socket clients (and each autocannon run) adds a process 'exit' listener while it lives.
  process.setMaxListeners(1000);
  const dir = mkdtempSync(join(tmpdir(), 'matchloom-load-'));
  let server: ServerProc | null = null;
  let failed: boolean;
  try {
    process.stderr.write('starting the server (production settings, demo data)...\n');
    server = await startServerProcess(dir);
    const idleRss = rssMb(server.pid);
    const loadAtStart = loadavg().map((l) => l.toFixed(1)).join(' / ');
    const signin = await call(server.url, null, 'POST', '/api/auth/signin', { email: DEMO_USERS[0].email, password: DEMO_PASSWORD });
    if (signin.status !== 200) throw new Error(`demo sign-in failed: ${signin.status}`);
    const ownerCookie = cookieFrom(signin.setCookie);
    const rooms = await must(call(server.url, ownerCookie, 'GET', '/api/rooms'), 200, 'rooms');
    const roomId = (rooms as { id: string }[])[0]?.id;
    if (!roomId) throw new Error('the demo owner has no room');
    // A snapshot or two, so the snapshot list has something to send.
    for (const label of ['Load bench baseline', 'Load bench tuned'])
      await must(call(server.url, ownerCookie, 'POST', `/api/rooms/${roomId}/snapshots`, { label }), 201, 'snapshot');

    process.stderr.write(`HTTP: ${HTTP_SECONDS} s per run...\n`);
    const httpRows = await httpPhase(server, ownerCookie, roomId);

    process.stderr.write(`sockets: ${ROOMS} rooms × ${PEOPLE_PER_ROOM} people, ${EDIT_HZ} Hz for ${EDIT_SECONDS} s...\n`);
    const tunerSignin = await call(server.url, null, 'POST', '/api/auth/signin', { email: DEMO_USERS[1].email, password: DEMO_PASSWORD });
    const cookies = [ownerCookie, cookieFrom(tunerSignin.setCookie)];
    for (let i = cookies.length; i < PEOPLE_PER_ROOM; i++) {
      const r = await call(server.url, null, 'POST', '/api/auth/signup', { email: `load-${i}-${Date.now()}@example.test`, password: 'load bench password', displayName: `Load Engineer ${i}` });
      if (r.status !== 201) throw new Error(`signup failed: ${r.status}`);
      cookies.push(cookieFrom(r.setCookie));
    }
    const s = await socketPhase(server, cookies);

    // ---- report ----
    const errorsOf = (r: AutocannonResult) => r.errors + r.timeouts + r.non2xx;
    console.log(`\nMatchloom load benchmark (loopback; the load generator shares the machine's ${availableParallelism()} cores with the server; load average at start ${loadAtStart}; server idle RSS ${idleRss.toFixed(0)} MB)\n`);
    console.log(`HTTP read routes, ${HTTP_SECONDS} s per run, session cookie:\n`);
    console.log(
      table(
        ['route', 'conns', 'req/s', 'MB/s', 'p50 ms', 'p97.5 ms', 'p99 ms', 'max ms', 'errors', 'server CPU %', 'generator CPU %', 'peak RSS MB'],
        httpRows.map((r) => [
          r.route,
          r.connections,
          Math.round(r.result.requests.average),
          r.result.throughput.average / 1048576,
          r.result.latency.p50,
          r.result.latency.p97_5,
          r.result.latency.p99,
          r.result.latency.max,
          errorsOf(r.result),
          r.cpuPercent,
          r.generatorCpuPercent,
          r.peakRssMb,
        ]),
      ),
    );
    for (const route of [...new Set(httpRows.map((r) => r.route))]) {
      const rs = httpRows.filter((r) => r.route === route);
      const best = rs.reduce((a, b) => (b.result.requests.average > a.result.requests.average ? b : a));
      console.log(`  ${route}: most throughput at ${best.connections} connections (${Math.round(best.result.requests.average)} req/s, server CPU ${best.cpuPercent.toFixed(0)} % of one core)`);
    }
    const f = s.figures;
    const lat = f.latencies.sort((a, b) => a - b);
    console.log(`\nRoom sockets: ${f.rooms} rooms × ${PEOPLE_PER_ROOM} people (${f.clients} y-websocket providers + ${f.clients} socket.io clients), each editing at ${EDIT_HZ} Hz for ${EDIT_SECONDS} s:\n`);
    console.log(
      table(
        ['figure', 'value'],
        [
          ['connect, sync and join all clients (ms)', f.syncMs],
          ['edits sent', f.editsSent],
          ['edits per second (all rooms)', f.editsSent / EDIT_SECONDS],
          ['deliveries expected (edits × 3 others)', f.deliveriesExpected],
          ['deliveries seen', f.deliveries],
          ['propagation p50 (ms)', percentile(lat, 50)],
          ['propagation p97.5 (ms)', percentile(lat, 97.5)],
          ['propagation p99 (ms)', percentile(lat, 99)],
          ['propagation max (ms)', lat[lat.length - 1] ?? NaN],
          ['room socket closes while editing', f.providerCloses],
          ['socket.io disconnects while editing', f.eventDisconnects],
          ['socket.io join failures', f.joinFailures],
          ['room log events received', f.roomLogEvents],
          ['presence events received', f.presenceEvents],
          ['edits offered per second (clients × rate)', f.clients * EDIT_HZ],
          ['server CPU while editing (% of one core)', s.cpuPercent],
          ['load generator CPU while editing (% of one core)', s.generatorCpuPercent],
          ['machine load average (1 min) after editing', s.loadAverage],
          ['server RSS with all clients connected (MB)', s.setupRssMb],
          ['server peak RSS while editing (MB)', s.peakRssMb],
        ],
      ),
    );
    const httpErrors = httpRows.reduce((n, r) => n + errorsOf(r.result), 0);
    const lost = f.deliveriesExpected - f.deliveries;
    failed = httpErrors > 0 || f.providerCloses > 0 || f.eventDisconnects > 0 || f.joinFailures > 0 || lost > 0;
    console.log(`\n${failed ? 'FAILED' : 'OK'}: ${httpErrors} HTTP errors, ${f.providerCloses + f.eventDisconnects} socket drops, ${f.joinFailures} join failures, ${lost} edits not seen by every other client.`);
  } finally {
    if (server) await stopServerProcess(server);
    rmSync(dir, { recursive: true, force: true });
  }
  process.exit(failed ? 1 : 0);
}

main().catch((e: unknown) => {
  process.stderr.write(`bench:load failed: ${(e as Error)?.stack ?? String(e)}\n`);
  process.exit(1);
});
