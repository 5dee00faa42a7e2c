// No user enumeration: sign-in with an unknown address and with a wrong password give the same status,
// code and message (and take comparable time: printed, not asserted); adding a member reveals about the
// address no more than the role flow needs (a known account: the member entry the room will show
// anyway; an unknown one: only what the owner typed), and a non-owner learns nothing at all.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../server/helpers/test-server';
import { roomFixture, signUpAccount, type Account, type RoomFixture } from './helpers/fixtures';
import { rawRequest } from './helpers/http';

let server: TestServer;
let alice: Account;
let f: RoomFixture;

beforeAll(async () => {
  server = await startTestServer();
  alice = await signUpAccount(server.url, 'Alice');
  f = await roomFixture(server.url);
});
afterAll(async () => {
  await server.close();
});

const signin = (email: string, password: string) => rawRequest(server.url, { method: 'POST', path: '/api/auth/signin', body: { email, password } });

describe('sign-in refusals', () => {
  it('an unknown address and a wrong password are indistinguishable (status, headers that matter, body)', async () => {
    const unknown = await signin('nobody-here@example.test', 'whatever password');
    const wrong = await signin(alice.email, 'whatever password');
    const wrongCase = await signin(alice.email.toUpperCase(), 'whatever password');
    const short = await signin('nobody-here@example.test', 'x');
    for (const r of [unknown, wrong, wrongCase, short]) {
      expect(r.status).toBe(401);
      expect(r.json).toEqual(unknown.json);
      expect(r.headers['set-cookie']).toBeUndefined();
      expect(r.text).not.toContain(alice.email);
    }
    expect(unknown.headers['content-length']).toBe(wrong.headers['content-length']);
  });

  it('the time to refuse does not tell them apart by much (measured, printed)', async () => {
    const statuses = new Set<number>();
    const time = async (email: string) => {
      const t0 = performance.now();
      statuses.add((await signin(email, 'whatever password')).status);
      return performance.now() - t0;
    };
    const median = (xs: number[]) => xs.sort((x, y) => x - y)[Math.floor(xs.length / 2)];
    const unknown: number[] = [];
    const wrong: number[] = [];
    for (let i = 0; i < 15; i++) {
      unknown.push(await time(`nobody-${i}@example.test`));
      wrong.push(await time(alice.email));
    }
    process.stdout.write(`sign-in refusal median: unknown address ${median(unknown).toFixed(1)} ms, wrong password ${median(wrong).toFixed(1)} ms (bcrypt cost ${server.config.bcryptCost})\n`);
    expect([...statuses]).toEqual([401]);
  });

  it('sign-up of a taken address does not echo the address or name the account', async () => {
    const res = await rawRequest(server.url, { method: 'POST', path: '/api/auth/signup', body: { email: alice.email, password: 'another long password', displayName: 'X' } });
    expect(res.status).toBe(409);
    expect(res.text).not.toContain(alice.email);
    expect(res.text).not.toContain(alice.displayName);
    expect(res.text).not.toContain(alice.id);
  });
});

describe('adding a member', () => {
  it('a known address: the member entry (what the members list shows) and nothing more', async () => {
    const res = await rawRequest(server.url, { method: 'POST', path: `/api/rooms/${f.roomId}/members`, cookie: f.owner.cookie, body: { email: alice.email, role: 'observer' } });
    expect(res.status).toBe(201);
    const body = res.json as Record<string, unknown>;
    expect(Object.keys(body).sort()).toEqual(expect.arrayContaining(['displayName', 'email', 'role', 'userId']));
    expect(res.text).not.toMatch(/password|hash|\$2[aby]\$/i);
    const list = await rawRequest(server.url, { method: 'GET', path: `/api/rooms/${f.roomId}/members`, cookie: f.owner.cookie });
    const entry = (list.json as Record<string, unknown>[]).find((m) => m.userId === alice.id);
    // The answer is exactly the entry the room now lists for everyone in it.
    expect(entry).toEqual(body);
  });

  it('an unknown address: only what the owner typed, the role and the invitation; no account fields', async () => {
    const email = 'not-yet-here@example.test';
    const res = await rawRequest(server.url, { method: 'POST', path: `/api/rooms/${f.roomId}/members`, cookie: f.owner.cookie, body: { email, role: 'tuner' } });
    expect(res.status).toBe(202);
    const body = res.json as Record<string, unknown>;
    expect(body).not.toHaveProperty('userId');
    expect(body).not.toHaveProperty('displayName');
    expect(body.email).toBe(email);
    expect(res.text).not.toMatch(/password|hash|token/i);
  });

  it('to anyone but an owner the answer is the same refusal for a known and an unknown address', async () => {
    for (const who of [f.tuner, f.observer]) {
      const known = await rawRequest(server.url, { method: 'POST', path: `/api/rooms/${f.roomId}/members`, cookie: who.cookie, body: { email: alice.email, role: 'tuner' } });
      const unknown = await rawRequest(server.url, { method: 'POST', path: `/api/rooms/${f.roomId}/members`, cookie: who.cookie, body: { email: 'ghost@example.test', role: 'tuner' } });
      expect(known.status).toBe(403);
      expect(known.json).toEqual(unknown.json);
    }
    const stranger = await signUpAccount(server.url, 'Stranger');
    const k = await rawRequest(server.url, { method: 'POST', path: `/api/rooms/${f.roomId}/members`, cookie: stranger.cookie, body: { email: alice.email, role: 'tuner' } });
    const u = await rawRequest(server.url, { method: 'POST', path: `/api/rooms/${f.roomId}/members`, cookie: stranger.cookie, body: { email: 'ghost@example.test', role: 'tuner' } });
    expect(k.status).toBe(404);
    expect(k.json).toEqual(u.json);
  });

  it('an invitation preview by a wrong token says nothing about any room or address', async () => {
    for (const token of ['a'.repeat(43), 'short', '%00', '..']) {
      const res = await rawRequest(server.url, { method: 'GET', path: `/api/invitations/${encodeURIComponent(token)}` });
      expect(res.status).toBe(404);
      expect(res.text).not.toContain('not-yet-here@example.test');
      expect(res.text).not.toContain('Room-marker');
    }
  });
});
