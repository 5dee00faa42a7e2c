/**
 * A real Matchloom server for the collaboration tests (startServer on a fresh SQLite file in a temp
 * folder, port 0 on 127.0.0.1), people signed up through the API, rooms created through the API, and
 * real y-websocket providers in Node (WebSocketPolyfill: ws, disableBc) holding a person's cookie or a
 * collab token.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import WebSocket from 'ws';
import * as Y from 'yjs';
import { WebsocketProvider } from 'y-websocket';
import { loadConfig, type Config } from '../../../server/config';
import { startServer, type RunningServer } from '../../../server/main';
import type { DesignInput } from '../../../shared/rf/design';

export interface Person {
  id: string;
  email: string;
  displayName: string;
  /** `ml_session=<token>` */
  cookie: string;
}

export interface Peer {
  doc: Y.Doc;
  provider: WebsocketProvider;
  /** Resolves on the first sync. */
  synced: Promise<void>;
  /** Every close the provider saw, in order. */
  closes: { code: number; reason: string }[];
  /** Resolves with the first final (44xx) close. */
  finalClose: Promise<{ code: number; reason: string }>;
  /** Number of socket connection attempts the provider made. */
  attempts(): number;
  destroy(): void;
}

let counter = 0;

export function tempDir(prefix = 'matchloom-collab-'): string {
  return mkdtempSync(join(tmpdir(), prefix));
}

export function testConfig(databaseFile: string, overrides: Partial<Config> = {}): Config {
  return {
    ...loadConfig({ NODE_ENV: 'test', LOG_LEVEL: 'silent', DATABASE_FILE: databaseFile, BCRYPT_COST: '4', JWT_SECRET: 'collab-tests-secret-of-at-least-32-chars' }),
    port: 0,
    host: '127.0.0.1',
    seedDemo: false,
    ...overrides,
  };
}

/** A design with the given elements (2.4 GHz band, 18 + j8 Ω load). */
export function designWith(elements: DesignInput['elements'] = []): DesignInput {
  return {
    format: 'matchloom-design',
    version: 1,
    name: 'Collab test design',
    referenceOhms: 50,
    load: { kind: 'impedance', ohms: [18, 8] },
    band: { startHz: 2.4e9, stopHz: 2.4835e9 },
    sweep: { startHz: 2e9, stopHz: 2.9e9, points: 101 },
    goal: { maxVswr: 2 },
    elements,
  };
}

/** A client of a running server at `baseUrl` (http://127.0.0.1:port). */
export class Api {
  constructor(readonly baseUrl: string) {}

  get wsBase(): string {
    return this.baseUrl.replace(/^http/, 'ws');
  }

  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- JSON bodies, checked by each test
  async call(person: Person | null, method: string, path: string, body?: unknown): Promise<{ status: number; body: any }> {
    const res = await fetch(this.baseUrl + path, {
      method,
      headers: { 'content-type': 'application/json', ...(person ? { cookie: person.cookie } : {}) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const text = await res.text();
    return { status: res.status, body: text ? JSON.parse(text) : null };
  }

  async signUp(displayName: string): Promise<Person> {
    counter += 1;
    const email = `${displayName.toLowerCase().replace(/\W+/g, '-')}-${process.pid}-${counter}@example.test`;
    const res = await fetch(this.baseUrl + '/api/auth/signup', {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email, password: 'correct horse battery', displayName }),
    });
    if (res.status !== 201) throw new Error(`signup failed: ${res.status} ${await res.text()}`);
    const user = (await res.json()) as { id: string };
    const setCookie = res.headers.getSetCookie().find((c) => c.startsWith('ml_session='));
    if (!setCookie) throw new Error('signup set no session cookie');
    return { id: user.id, email, displayName, cookie: setCookie.split(';')[0] };
  }

  async createRoom(owner: Person, design: DesignInput = designWith()): Promise<string> {
    const r = await this.call(owner, 'POST', '/api/rooms', { name: 'Collab test room', design });
    if (r.status !== 201) throw new Error(`create room failed: ${r.status} ${JSON.stringify(r.body)}`);
    return r.body.id as string;
  }

  async addMember(owner: Person, roomId: string, who: Person, role: 'tuner' | 'observer' | 'owner'): Promise<void> {
    const r = await this.call(owner, 'POST', `/api/rooms/${roomId}/members`, { email: who.email, role });
    if (r.status !== 201) throw new Error(`add member failed: ${r.status} ${JSON.stringify(r.body)}`);
  }

  async setRole(owner: Person, roomId: string, who: Person, role: 'tuner' | 'observer' | 'owner'): Promise<void> {
    const r = await this.call(owner, 'PATCH', `/api/rooms/${roomId}/members/${who.id}`, { role });
    if (r.status !== 200) throw new Error(`set role failed: ${r.status} ${JSON.stringify(r.body)}`);
  }

  async removeMember(owner: Person, roomId: string, who: Person): Promise<void> {
    const r = await this.call(owner, 'DELETE', `/api/rooms/${roomId}/members/${who.id}`);
    if (r.status !== 204) throw new Error(`remove member failed: ${r.status} ${JSON.stringify(r.body)}`);
  }

  async collabToken(person: Person, roomId: string): Promise<string> {
    const r = await this.call(person, 'POST', `/api/rooms/${roomId}/collab-token`);
    if (r.status !== 200) throw new Error(`collab token failed: ${r.status}`);
    return r.body.token as string;
  }

  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- the design file as JSON
  async design(person: Person, roomId: string): Promise<any> {
    const r = await this.call(person, 'GET', `/api/rooms/${roomId}/design`);
    if (r.status !== 200) throw new Error(`design failed: ${r.status} ${JSON.stringify(r.body)}`);
    return r.body;
  }

  /** A real y-websocket provider for `person` (by cookie, or by `token` when given). */
  peer(person: Person | null, roomId: string, opts: { token?: string; doc?: Y.Doc; headers?: Record<string, string> } = {}): Peer {
    const doc = opts.doc ?? new Y.Doc();
    const headers: Record<string, string> = { ...(person && !opts.token ? { cookie: person.cookie } : {}), ...opts.headers };
    let attempts = 0;
    class HeaderWebSocket extends WebSocket {
      constructor(url: string, protocols?: string | string[]) {
        super(url, protocols, { headers });
        attempts++;
      }
    }
    const provider = new WebsocketProvider(`${this.wsBase}/collab`, roomId, doc, {
      WebSocketPolyfill: HeaderWebSocket as unknown as typeof globalThis.WebSocket,
      disableBc: true,
      params: opts.token ? { token: opts.token } : {},
      maxBackoffTime: 500,
    });
    const closes: { code: number; reason: string }[] = [];
    provider.on('connection-close', (event) => {
      if (event) closes.push({ code: event.code, reason: event.reason });
    });
    const synced = new Promise<void>((resolve) => {
      if (provider.synced) resolve();
      provider.on('sync', (s: boolean) => s && resolve());
    });
    const finalClose = new Promise<{ code: number; reason: string }>((resolve) => provider.on('closed', (e) => resolve(e)));
    return {
      doc,
      provider,
      synced,
      closes,
      finalClose,
      attempts: () => attempts,
      destroy: () => {
        provider.destroy();
        doc.destroy();
      },
    };
  }
}

export interface World extends Api {
  server: RunningServer;
  config: Config;
  dir: string;
  close(): Promise<void>;
}

/** Start a real server for one test file. */
export async function startWorld(overrides: Partial<Config> = {}): Promise<World> {
  const dir = tempDir();
  const config = testConfig(join(dir, 'matchloom.sqlite3'), overrides);
  const server = await startServer(config, { clientDir: null });
  const api = new Api(`http://127.0.0.1:${server.port}`);
  return Object.assign(api, {
    server,
    config,
    dir,
    async close() {
      await server.close();
      rmSync(dir, { recursive: true, force: true });
    },
  });
}

/** Poll until `check` returns true (or throw with `what` after `timeoutMs`). */
export async function until(what: string, check: () => boolean | Promise<boolean>, timeoutMs = 5000): Promise<void> {
  const end = Date.now() + timeoutMs;
  for (;;) {
    if (await check()) return;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await sleep(10);
  }
}

export const sleep = (ms: number) => new Promise<void>((r) => setTimeout(r, ms));

/** JSON text with object keys sorted (peers may hold map keys in different insertion orders). */
export function canonicalJson(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(canonicalJson).join(',')}]`;
  if (v && typeof v === 'object')
    return `{${Object.keys(v)
      .sort()
      .map((k) => `${JSON.stringify(k)}:${canonicalJson((v as Record<string, unknown>)[k])}`)
      .join(',')}}`;
  return JSON.stringify(v) ?? 'null';
}

/** The document's design map (with order keys) as canonical JSON, for convergence checks. */
export function docJson(doc: Y.Doc): string {
  return canonicalJson(doc.getMap('design').toJSON());
}

export async function converged(peers: readonly Peer[], timeoutMs = 5000): Promise<void> {
  await until(
    'the documents to converge',
    () => {
      const first = docJson(peers[0].doc);
      return peers.every((p) => docJson(p.doc) === first);
    },
    timeoutMs,
  );
}

/** A small deterministic PRNG (mulberry32, common practice). */
export function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
