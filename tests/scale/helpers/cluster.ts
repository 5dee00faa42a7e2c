/**
 * Two (or more) Matchloom processes on one PostgreSQL and one Redis, for the scale-out tests run by
 * scripts/scale-test.sh (which sets DATABASE_URL to a throwaway cluster and REDIS_URL to a throwaway
 * redis-server). Each test file makes its own database on that cluster; each process is a child
 * `node --import tsx tests/scale/fixtures/scale-server.ts` on port 0 that prints {"port": n}.
 *
 * Guarded as tests/pg is: without DATABASE_URL and REDIS_URL (the plain `npm test` run) each file's
 * suite is collected but not run, and its title says how to run it.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import { createInterface } from 'node:readline';
import knex from 'knex';
import { io, type Socket } from 'socket.io-client';
import { describe } from 'vitest';
import { ROOM_EVENTS, type JoinReply, type PresencePayload, type RoleChangedPayload, type RoomLogEntry } from '../../../shared/collab/events';
import type { Element } from '../../../shared/rf/design';
import { Api, designWith, until, type Person } from '../../collab/helpers/world';

const clusterUrl = process.env.DATABASE_URL;
const redisUrl = process.env.REDIS_URL;
export const scaleReady = Boolean(clusterUrl && redisUrl);

/**
 * The suites' `describe`. vite.config.ts leaves tests/scale out of the plain run; scripts/scale-test.sh
 * sets DATABASE_URL and REDIS_URL. Run any other way, a file fails at once saying so.
 */
export function describeScale(title: string, body: () => void): void {
  if (!scaleReady) throw new Error('DATABASE_URL and REDIS_URL are not set: run scripts/scale-test.sh');
  describe(title, body);
}
export const scaleTitle = (title: string) => title;

/** A new, empty database on the cluster for one test file; returns its postgres:// address. */
export async function freshDatabase(label: string): Promise<string> {
  if (!clusterUrl) throw new Error('DATABASE_URL is not set: run scripts/scale-test.sh');
  const name = `matchloom_scale_${label.replace(/\W+/g, '_')}_${process.pid}_${Date.now()}`.toLowerCase();
  const admin = knex({ client: 'pg', connection: clusterUrl, pool: { min: 0, max: 1 } });
  try {
    await admin.raw(`CREATE DATABASE ${name}`);
  } finally {
    await admin.destroy();
  }
  const url = new URL(clusterUrl);
  url.pathname = `/${name}`;
  return url.toString();
}

const SCRIPT = join(process.cwd(), 'tests', 'scale', 'fixtures', 'scale-server.ts');

export interface Process {
  label: string;
  child: ChildProcess;
  api: Api;
  port: number;
  /** Resolves once the process has exited (by any means). */
  exited: Promise<void>;
  alive(): boolean;
  /** SIGTERM and wait for the exit. */
  stop(): Promise<void>;
}

const started: Process[] = [];

/**
 * Start one Matchloom process on `databaseUrl`. Start the processes of a test one after another: the
 * first runs the migrations, and Knex refuses (rather than waits) while another holds the migration lock.
 */
export async function startProcess(label: string, databaseUrl: string): Promise<Process> {
  if (!redisUrl) throw new Error('REDIS_URL is not set: run scripts/scale-test.sh');
  // `node --import tsx`, not the tsx wrapper: a SIGKILL of the wrapper would leave its grandchild running.
  const child = spawn(process.execPath, ['--import', 'tsx', SCRIPT], {
    env: { ...process.env, DATABASE_URL: databaseUrl, REDIS_URL: redisUrl },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let stderr = '';
  child.stderr!.on('data', (d) => (stderr += String(d)));
  // SCALE_TEST_LOG=<pino level> shows the processes' logs (the fixture passes it on as LOG_LEVEL).
  if (process.env.SCALE_TEST_LOG) {
    child.stdout!.on('data', (d) => process.stderr.write(`[${label}] ${String(d)}`));
    child.stderr!.on('data', (d) => process.stderr.write(`[${label}] ${String(d)}`));
  }
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const port = await new Promise<number>((resolve, reject) => {
    const lines = createInterface({ input: child.stdout! });
    lines.once('line', (line) => resolve(JSON.parse(line).port));
    child.once('exit', (code, signal) => reject(new Error(`process ${label} exited (${code ?? signal}) before listening: ${stderr}`)));
  });
  const alive = () => child.exitCode === null && child.signalCode === null;
  const p: Process = {
    label,
    child,
    api: new Api(`http://127.0.0.1:${port}`),
    port,
    exited,
    alive,
    async stop() {
      if (alive()) child.kill('SIGTERM');
      await exited;
    },
  };
  started.push(p);
  return p;
}

export interface TwoProcessRoom<N extends string> {
  db: string;
  A: Process;
  B: Process;
  owner: Person;
  people: Record<N, Person>;
  roomId: string;
}

/**
 * The usual set-up of a scale test: processes A and B on a fresh database `label`, an owner (signed up
 * on A) with a room holding `elements`, and each of `members` signed up and added with its role through
 * its process (`via`, A unless said).
 */
export async function twoProcessRoom<N extends string>(
  label: string,
  members: Record<N, { name: string; role: 'tuner' | 'observer'; via?: 'A' | 'B' }>,
  elements: Element[],
): Promise<TwoProcessRoom<N>> {
  const db = await freshDatabase(label);
  const A = await startProcess('A', db);
  const B = await startProcess('B', db);
  const through = (via?: 'A' | 'B') => (via === 'B' ? B : A).api;
  const owner = await A.api.signUp('Owner');
  const entries = Object.entries(members) as [N, { name: string; role: 'tuner' | 'observer'; via?: 'A' | 'B' }][];
  const people = {} as Record<N, Person>;
  for (const [key, m] of entries) people[key] = await through(m.via).signUp(m.name);
  const roomId = await A.api.createRoom(owner, designWith(elements));
  for (const [key, m] of entries) await through(m.via).addMember(owner, roomId, people[key], m.role);
  return { db, A, B, owner, people, roomId };
}

/** Stop every process started here (SIGTERM, then SIGKILL for any still running after 10 s). */
export async function stopAll(): Promise<void> {
  await Promise.all(
    started.splice(0).map(async (p) => {
      if (!p.alive()) return;
      p.child.kill('SIGTERM');
      const timer = setTimeout(() => p.alive() && p.child.kill('SIGKILL'), 10_000);
      await p.exited;
      clearTimeout(timer);
    }),
  );
}

/** A socket.io client of one process, keeping the room events it receives. */
export interface EventClient {
  socket: Socket;
  presence: PresencePayload[];
  log: RoomLogEntry[];
  roleChanges: RoleChangedPayload[];
  join(roomId: string): Promise<JoinReply>;
  /** The newest presence list received for `roomId` (the join reply's until an event comes). */
  members(roomId: string): string[];
  close(): void;
}

export async function connectEvents(api: Api, person: Person): Promise<EventClient> {
  const socket = io(api.baseUrl, {
    path: '/socket.io',
    transports: ['websocket'],
    forceNew: true,
    reconnection: false,
    extraHeaders: { cookie: person.cookie },
  });
  const latest = new Map<string, string[]>();
  const c: EventClient = {
    socket,
    presence: [],
    log: [],
    roleChanges: [],
    async join(roomId) {
      const reply = (await socket.emitWithAck(ROOM_EVENTS.join, { roomId })) as JoinReply;
      if (reply.ok && !latest.has(roomId)) latest.set(roomId, reply.presence.map((m) => m.userId));
      return reply;
    },
    members: (roomId) => latest.get(roomId) ?? [],
    close: () => socket.disconnect(),
  };
  socket.on(ROOM_EVENTS.presence, (p: PresencePayload) => {
    c.presence.push(p);
    latest.set(p.roomId, p.members.map((m) => m.userId));
  });
  socket.on(ROOM_EVENTS.log, (e: RoomLogEntry) => c.log.push(e));
  socket.on(ROOM_EVENTS.roleChanged, (e: RoleChangedPayload) => c.roleChanges.push(e));
  await new Promise<void>((resolve, reject) => {
    socket.once('connect', () => resolve());
    socket.once('connect_error', (e) => reject(e));
  });
  return c;
}

/** Poll the design file (GET /api/rooms/:id/design) on `api` until `check` holds. */
export async function untilDesign(
  what: string,
  api: Api,
  person: Person,
  roomId: string,
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- the design file as JSON
  check: (design: any) => boolean,
  timeoutMs = 20_000,
): Promise<void> {
  await until(what, async () => check(await api.design(person, roomId)), timeoutMs);
}
