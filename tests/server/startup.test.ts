import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createLogger } from '../../server/logger';
import { startServer } from '../../server/main';
import { SESSION_COOKIE } from '../../server/auth/tokens';
import { TEST_PASSWORD, startTestServer, uniqueEmail, type TestServer } from './helpers/test-server';

const clientDir = mkdtempSync(join(tmpdir(), 'matchloom-client-'));
mkdirSync(join(clientDir, 'assets'));
writeFileSync(join(clientDir, 'index.html'), '<!doctype html><title>Matchloom test shell</title>');
writeFileSync(join(clientDir, 'assets', 'app-abc123.js'), 'console.log("app")');

const logLines: string[] = [];
const logStream = new Writable({
  write(chunk, _enc, cb) {
    logLines.push(String(chunk));
    cb();
  },
});

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer(
    { logLevel: 'debug' },
    { clientDir, logger: createLogger({ logLevel: 'debug', nodeEnv: 'test' }, logStream) },
  );
});
afterAll(async () => {
  await server.close();
  rmSync(clientDir, { recursive: true, force: true });
});

describe('start-up', () => {
  it('GET /api/health is { ok: true } once migrated and listening', async () => {
    const res = await supertest(server.url).get('/api/health').expect(200);
    expect(res.body).toEqual({ ok: true });
    const migrations = await server.knex('knex_migrations').select('name');
    expect(migrations.map((m) => m.name)).toContain('20261201_0001_initial');
  });

  it('opens SQLite in WAL mode with foreign keys and a busy timeout', async () => {
    const mode = await server.knex.raw('PRAGMA journal_mode');
    expect(mode[0].journal_mode).toBe('wal');
    expect((await server.knex.raw('PRAGMA foreign_keys'))[0].foreign_keys).toBe(1);
    expect((await server.knex.raw('PRAGMA busy_timeout'))[0].timeout).toBe(5000);
  });

  it('creates the database folder', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'matchloom-nested-'));
    const s = await startServer(
      { ...server.config, logLevel: 'silent', databaseFile: join(dir, 'a', 'b', 'm.sqlite3') },
      { clientDir: null },
    );
    try {
      await supertest(s.url).get('/api/health').expect(200);
    } finally {
      await s.close();
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('reports a port in use and leaves nothing open', async () => {
    await expect(
      startServer({ ...server.config, logLevel: 'silent', port: server.port }, { clientDir: null }),
    ).rejects.toMatchObject({ code: 'EADDRINUSE' });
  });

  it('close() stops listening and closes the database', async () => {
    const s = await startTestServer();
    await supertest(s.url).get('/api/health').expect(200);
    await s.close();
    await expect(fetch(`${s.url}/api/health`)).rejects.toThrow();
    await expect(s.knex.raw('select 1')).rejects.toThrow();
  });
});

describe('the built client', () => {
  it('serves static files and index.html for the app routes', async () => {
    const root = await supertest(server.url).get('/').expect(200);
    expect(root.text).toContain('Matchloom test shell');
    expect(root.headers['content-type']).toMatch(/text\/html/);
    const deep = await supertest(server.url).get('/rooms/some-room/chain').expect(200);
    expect(deep.text).toContain('Matchloom test shell');
    const asset = await supertest(server.url).get('/assets/app-abc123.js').expect(200);
    expect(asset.headers['cache-control']).toMatch(/immutable/);
  });

  it('never answers an API or socket path with the app', async () => {
    for (const path of ['/api/no-such-route', '/collab/xyz', '/socket.io/nothing']) {
      const res = await supertest(server.url).get(path);
      expect(res.headers['content-type'] ?? '').not.toMatch(/text\/html/);
    }
    expect((await supertest(server.url).get('/api/no-such-route').expect(404)).body.error.code).toBe(
      'not-found',
    );
  });

  it('sends security headers', async () => {
    const res = await supertest(server.url).get('/');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});

describe('logs', () => {
  it('record requests without passwords, cookies or tokens', async () => {
    const agent = server.agent();
    const email = uniqueEmail('logged');
    const res = await agent
      .post('/api/auth/signup')
      .send({ email, password: TEST_PASSWORD, displayName: 'Logged' })
      .expect(201);
    const token = String(res.headers['set-cookie'])
      .split(';')[0]
      .slice(SESSION_COOKIE.length + 1);
    await agent.get('/api/me').expect(200);
    await agent.post('/api/auth/signin').send({ email, password: 'wrong password here' }).expect(401);
    const text = logLines.join('');
    expect(text).toContain('/api/auth/signup');
    expect(text).not.toContain(TEST_PASSWORD);
    expect(text).not.toContain('wrong password here');
    expect(text).not.toContain(token);
  });
});
