// Hostile tokens on every door: the session cookie on HTTP, the collab token and the session cookie on the
// room socket (`/collab/<roomId>`: close 4401, never served), and both on socket.io (`/socket.io`: the
// connection is refused with an error). Tampered, expired, not-yet-valid, unsigned (`alg: none`), another
// key, another HMAC size, wrong or missing issuer or audience, garbage. JWT rules: HS256 only, issuer
// "matchloom", the audience of the token's kind, an expiry in the future (that an expiry must be present at
// all is checked in jwt-expiry-required.pending.ts until the token service requires it).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../server/helpers/test-server';
import { createTokenService } from '../../server/auth/tokens';
import { collabClaims, forgeries, sessionClaims, type ForgedToken } from './helpers/forge';
import { roomFixture, type RoomFixture } from './helpers/fixtures';
import { checkAnswer, rawRequest } from './helpers/http';
import { eventsSocket, roomSocket } from './helpers/sockets';
import { writeCount } from './helpers/db';

let server: TestServer;
let wsBase: string;
let f: RoomFixture;
let realCollab: string;
let sessionForgeries: ForgedToken[];
let collabForgeries: ForgedToken[];

beforeAll(async () => {
  server = await startTestServer();
  wsBase = server.url.replace(/^http/, 'ws');
  f = await roomFixture(server.url);
  const res = await rawRequest(server.url, { method: 'POST', path: `/api/rooms/${f.roomId}/collab-token`, cookie: f.owner.cookie });
  realCollab = (res.json as { token: string }).token;
  sessionForgeries = await forgeries(sessionClaims(f.owner.id), f.owner.token, server.config.jwtSecret);
  collabForgeries = await forgeries(collabClaims(f.owner.id, f.roomId, 'owner'), realCollab, server.config.jwtSecret);
});
afterAll(async () => {
  await server.close();
});

describe('the token service itself', () => {
  it('verifies only HS256 tokens with its issuer, the right audience and a future expiry', async () => {
    const tokens = createTokenService(server.config.jwtSecret);
    expect(await tokens.verifySession(f.owner.token)).toEqual({ userId: f.owner.id });
    expect(await tokens.verifyCollab(realCollab)).toEqual({ userId: f.owner.id, roomId: f.roomId, role: 'owner' });
    for (const { name, token } of sessionForgeries) expect(await tokens.verifySession(token), name).toBeNull();
    for (const { name, token } of collabForgeries) expect(await tokens.verifyCollab(token), name).toBeNull();
    // Neither kind stands in for the other.
    expect(await tokens.verifySession(realCollab)).toBeNull();
    expect(await tokens.verifyCollab(f.owner.token)).toBeNull();
  });
});

describe('HTTP with a hostile session cookie', () => {
  it('every forgery is 401 in the error shape on reads and writes, and writes nothing', async () => {
    const cases = [...sessionForgeries, { name: 'a collab token as the session', token: realCollab }];
    for (const { name, token } of cases) {
      const cookie = `ml_session=${token}`;
      for (const req of [
        { method: 'GET', path: '/api/me', cookie },
        { method: 'GET', path: '/api/rooms', cookie },
        { method: 'GET', path: `/api/rooms/${f.roomId}/design`, cookie },
        { method: 'POST', path: '/api/rooms', cookie, body: { name: 'forged room' } },
        { method: 'POST', path: `/api/rooms/${f.roomId}/collab-token`, cookie },
        { method: 'POST', path: `/api/rooms/${f.roomId}/members`, cookie, body: { email: 'x@example.test', role: 'owner' } },
      ]) {
        const before = await writeCount(server.knex);
        const res = await rawRequest(server.url, req);
        expect(checkAnswer(req, res), `${name}: ${req.method} ${req.path}`).toBe(true);
        expect(res.status, `${name}: ${req.method} ${req.path}`).toBe(401);
        expect((res.json as { error: { code: string } }).error.code).toBe('unauthenticated');
        expect(await writeCount(server.knex)).toBe(before);
      }
    }
  });

  it('the real cookie still works (the forgeries are refused for what they are)', async () => {
    expect((await rawRequest(server.url, { method: 'GET', path: '/api/me', cookie: f.owner.cookie })).status).toBe(200);
  });
});

describe('the room socket with hostile credentials', () => {
  it('a real collab token is served (the control)', async () => {
    const out = await roomSocket(wsBase, f.roomId, { token: realCollab, timeoutMs: 800 });
    expect(out.code).toBe(-1); // still open when the helper gave up waiting
    expect(out.gotMessages).toBeGreaterThan(0);
  });

  it('every forged collab token (?token=) is closed with 4401 before anything is served', async () => {
    for (const { name, token } of collabForgeries) {
      const out = await roomSocket(wsBase, f.roomId, { token });
      expect({ name, code: out.code, served: out.gotMessages }).toEqual({ name, code: 4401, served: 0 });
    }
  });

  it('every forged session cookie is closed with 4401 before anything is served', async () => {
    for (const { name, token } of sessionForgeries) {
      const out = await roomSocket(wsBase, f.roomId, { cookie: `ml_session=${token}` });
      expect({ name, code: out.code, served: out.gotMessages }).toEqual({ name, code: 4401, served: 0 });
    }
  });
});

describe('socket.io with hostile credentials', () => {
  it('the real cookie and a real collab token connect (the controls)', async () => {
    expect(await eventsSocket(server.url, { cookie: f.owner.cookie })).toEqual({ connected: true });
    expect(await eventsSocket(server.url, { token: realCollab })).toEqual({ connected: true });
  });

  it('every forged token in auth.token is refused with an error', async () => {
    for (const { name, token } of [...collabForgeries, ...sessionForgeries]) {
      const out = await eventsSocket(server.url, { token });
      expect(out.connected, name).toBe(false);
      expect(out.error, name).toBeTruthy();
    }
  });

  it('every forged session cookie is refused with an error, over websocket and over polling', async () => {
    for (const transport of ['websocket', 'polling'] as const) {
      for (const { name, token } of sessionForgeries) {
        const out = await eventsSocket(server.url, { cookie: `ml_session=${token}`, transport });
        expect(out.connected, `${transport}: ${name}`).toBe(false);
        expect(out.error, `${transport}: ${name}`).toBeTruthy();
      }
    }
  });

  it('no credentials at all: refused', async () => {
    const out = await eventsSocket(server.url, {});
    expect(out.connected).toBe(false);
  });
});
