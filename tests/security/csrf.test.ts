// Cross-site writes: a cookie-authenticated POST/PATCH/DELETE whose Origin names another site is 403
// `bad-origin` and writes nothing; the same origin is accepted; no Origin at all (curl, scripts, tests)
// is accepted, as server/auth/origin.ts documents (SameSite=Lax keeps the cookie off cross-site
// requests in browsers). The sockets refuse the session cookie from another site too.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../server/helpers/test-server';
import { roomFixture, type RoomFixture } from './helpers/fixtures';
import { checkAnswer, describeExchange, rawRequest, type RawRequest } from './helpers/http';
import { writeCount } from './helpers/db';
import { eventsSocket, roomSocket } from './helpers/sockets';

let server: TestServer;
let f: RoomFixture;
let host: string;

beforeAll(async () => {
  server = await startTestServer();
  f = await roomFixture(server.url);
  host = new URL(server.url).host;
});
afterAll(async () => {
  await server.close();
});

const writes = (roomId: string, tunerId: string): Omit<RawRequest, 'cookie' | 'headers'>[] => [
  { method: 'POST', path: '/api/rooms', body: { name: 'CSRF room' } },
  { method: 'PATCH', path: `/api/rooms/${roomId}`, body: { name: 'Renamed cross-site' } },
  { method: 'POST', path: `/api/rooms/${roomId}/members`, body: { email: 'attacker@example.test', role: 'owner' } },
  { method: 'PATCH', path: `/api/rooms/${roomId}/members/${tunerId}`, body: { role: 'owner' } },
  { method: 'POST', path: `/api/rooms/${roomId}/snapshots`, body: { label: 'cross-site' } },
  { method: 'POST', path: `/api/rooms/${roomId}/notes`, body: { body: 'cross-site note' } },
  { method: 'POST', path: `/api/rooms/${roomId}/collab-token` },
  { method: 'PATCH', path: '/api/me', body: { displayName: 'Hijacked' } },
  { method: 'DELETE', path: `/api/rooms/${roomId}/members/${tunerId}` },
  { method: 'DELETE', path: `/api/rooms/${roomId}` },
];

describe('a cookie-authenticated write from another site', () => {
  it.each([
    'https://evil.example',
    'http://HOST.evil.example',
    'http://127.0.0.1.evil.example',
    'null',
    'file://',
    'not a url',
    'http://HOSTNAME:1',
    'https://HOST@evil.example',
  ])('Origin %s: 403 bad-origin on every write route, nothing written', async (pattern) => {
    const origin = pattern.replace('HOSTNAME', host.replace(/:\d+$/, '')).replace('HOST', host);
    for (const w of writes(f.roomId, f.tuner.id)) {
      const req: RawRequest = { ...w, cookie: f.owner.cookie, headers: { origin } };
      const before = await writeCount(server.knex);
      const res = await rawRequest(server.url, req);
      checkAnswer(req, res);
      expect(res.status, describeExchange(req, res)).toBe(403);
      expect((res.json as { error: { code: string } }).error.code).toBe('bad-origin');
      expect(await writeCount(server.knex), describeExchange(req, res)).toBe(before);
    }
  });

  it('a text/plain "simple" cross-site POST (no preflight in a browser) is refused the same way', async () => {
    const req: RawRequest = { method: 'POST', path: '/api/rooms', cookie: f.owner.cookie, body: '{"name":"form post"}', headers: { origin: 'https://evil.example', 'content-type': 'text/plain' } };
    const res = await rawRequest(server.url, req);
    expect(res.status).toBe(403);
  });

  it('X-Forwarded-Host is honoured only because this client is a loopback proxy (the one proxy the app trusts)', async () => {
    // The test client is on loopback, which the app trusts as a proxy: the header is honoured here by design.
    const res = await rawRequest(server.url, { method: 'POST', path: '/api/rooms', cookie: f.owner.cookie, body: { name: 'via proxy' }, headers: { origin: 'https://app.example.test', 'x-forwarded-host': 'app.example.test' } });
    expect(res.status).toBe(201);
  });
});

describe('same origin and no Origin', () => {
  it('the same origin is accepted', async () => {
    const res = await rawRequest(server.url, { method: 'POST', path: '/api/rooms', cookie: f.owner.cookie, body: { name: 'same origin' }, headers: { origin: server.url } });
    expect(res.status).toBe(201);
  });
  it('no Origin (a non-browser client) is accepted', async () => {
    const res = await rawRequest(server.url, { method: 'POST', path: '/api/rooms', cookie: f.owner.cookie, body: { name: 'no origin' } });
    expect(res.status).toBe(201);
  });
  it('reads are not origin-checked (they change nothing)', async () => {
    const res = await rawRequest(server.url, { method: 'GET', path: '/api/rooms', cookie: f.owner.cookie, headers: { origin: 'https://evil.example' } });
    expect(res.status).toBe(200);
    expect(res.headers['access-control-allow-origin']).toBeUndefined();
  });
  it('the session cookie is SameSite=Lax and HttpOnly', async () => {
    const res = await rawRequest(server.url, { method: 'POST', path: '/api/auth/signin', body: { email: f.owner.email, password: f.owner.password } });
    const c = String(res.headers['set-cookie']);
    expect(c).toMatch(/HttpOnly/i);
    expect(c).toMatch(/SameSite=Lax/i);
  });
});

describe('the sockets and a foreign Origin with the session cookie', () => {
  it('room socket: 4401, nothing served', async () => {
    const out = await roomSocket(server.url.replace(/^http/, 'ws'), f.roomId, { cookie: f.owner.cookie, origin: 'https://evil.example' });
    expect(out).toMatchObject({ code: 4401, gotMessages: 0 });
  });
  it('socket.io: refused, over websocket and polling', async () => {
    for (const transport of ['websocket', 'polling'] as const) {
      const out = await eventsSocket(server.url, { cookie: f.owner.cookie, origin: 'https://evil.example', transport });
      expect(out.connected, transport).toBe(false);
    }
  });
  it('the same origin connects (the control)', async () => {
    expect((await eventsSocket(server.url, { cookie: f.owner.cookie, origin: server.url })).connected).toBe(true);
    const out = await roomSocket(server.url.replace(/^http/, 'ws'), f.roomId, { cookie: f.owner.cookie, origin: server.url, timeoutMs: 600 });
    expect(out.gotMessages).toBeGreaterThan(0);
  });
});
