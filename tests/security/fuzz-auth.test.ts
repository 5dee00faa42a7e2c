// Property-based hostile bodies against the account routes (sign-up, sign-in, sign-out, me): never a
// 5xx, always the error shape on a 4xx, and a refused request leaves every table as it was.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { startTestServer, type TestServer } from '../server/helpers/test-server';
import { signUpAccount, type Account } from './helpers/fixtures';
import { expectPrototypeClean, hostileString, probe, rawBody, requestWithRaw, runs, shapedBody, type FuzzTarget } from './helpers/fuzz';
import { rawRequest } from './helpers/http';
import { changedTables, fingerprint } from './helpers/db';

let server: TestServer;
let t: FuzzTarget;
let alice: Account;

beforeAll(async () => {
  server = await startTestServer();
  t = { baseUrl: server.url, knex: server.knex };
  alice = await signUpAccount(server.url, 'Alice');
});
afterAll(async () => {
  await server.close();
  expectPrototypeClean();
});

const email = fc.oneof(fc.emailAddress(), fc.constant('alice@example.test'));
const password = fc.oneof(fc.string({ minLength: 10, maxLength: 40 }), fc.constant('correct horse battery'));
const displayName = fc.string({ minLength: 1, maxLength: 80 });

describe('POST /api/auth/signup', () => {
  it('shaped hostile bodies: created (201), or refused with the error shape and no row written', async () => {
    await fc.assert(
      fc.asyncProperty(shapedBody({ email, password, displayName }), async (body) => {
        const status = await probe(t, { method: 'POST', path: '/api/auth/signup', body });
        expect([201, 400, 409]).toContain(status);
      }),
      runs(801, 120),
    );
  });

  it('raw bodies (bytes, wrong content types, deep nesting): refused cleanly', async () => {
    await fc.assert(
      fc.asyncProperty(rawBody, async (raw) => {
        const status = await probe(t, requestWithRaw({ method: 'POST', path: '/api/auth/signup' }, raw));
        expect(status).toBeGreaterThanOrEqual(400);
      }),
      runs(802, 60),
    );
  });

  it('an address differing only in case or spacing cannot make a second account', async () => {
    const res = await rawRequest(server.url, {
      method: 'POST',
      path: '/api/auth/signup',
      body: { email: `  ${alice.email.toUpperCase()}\t`, password: 'another long password', displayName: 'Imposter' },
    });
    expect(res.status).toBe(409);
    const rows = await server.knex('users').whereRaw('lower(email) = ?', [alice.email]).count({ n: '*' });
    expect(Number(rows[0].n)).toBe(1);
  });
});

describe('POST /api/auth/signin', () => {
  it('shaped hostile bodies: signed in (200) only with the right pair; otherwise 400/401 and nothing written', async () => {
    const pair = fc.constantFrom({ email: alice.email, password: alice.password });
    await fc.assert(
      fc.asyncProperty(fc.oneof(shapedBody({ email: fc.constant(alice.email), password }), pair), async (body) => {
        const status = await probe(t, { method: 'POST', path: '/api/auth/signin', body });
        const b = body as { email?: unknown; password?: unknown } | null;
        const right = b !== null && typeof b === 'object' && b.email === alice.email && b.password === alice.password;
        expect(status).toBe(right ? 200 : status === 400 ? 400 : 401);
      }),
      runs(803, 120),
    );
  });

  it('operator-like values (objects, arrays) for the address or password never sign anyone in', async () => {
    for (const body of [
      { email: { $ne: null }, password: { $ne: null } },
      { email: [alice.email], password: [alice.password] },
      { email: alice.email, password: { toString: alice.password } },
      { email: `${alice.email}' --`, password: 'x' },
      { email: "' OR '1'='1", password: "' OR '1'='1" },
      { email: alice.email, password: `${alice.password}\u0000` },
      { email: `${alice.email}\u0000`, password: alice.password },
    ]) {
      const status = await probe(t, { method: 'POST', path: '/api/auth/signin', body });
      expect(status, JSON.stringify(body)).not.toBe(200);
    }
  });

  it('raw bodies: refused cleanly, and the database is byte for byte as before', async () => {
    const before = await fingerprint(server.knex);
    await fc.assert(
      fc.asyncProperty(rawBody, async (raw) => {
        const status = await probe(t, requestWithRaw({ method: 'POST', path: '/api/auth/signin' }, raw));
        expect(status).toBeGreaterThanOrEqual(400);
      }),
      runs(804, 60),
    );
    expect(changedTables(before, await fingerprint(server.knex))).toEqual([]);
  });
});

describe('POST /api/auth/signout and GET /api/me', () => {
  it('hostile cookies and bodies: signout is 204, me is 200 only for a real session, else 401 with the shape', async () => {
    const cookie = fc.oneof(
      hostileString.map((s) => `ml_session=${encodeURIComponent(s)}`),
      hostileString.filter((s) => !/[\r\n\0]/.test(s) && /^[\x20-\x7e]*$/.test(s)),
      fc.constant(alice.cookie),
      fc.constant(`${alice.cookie}; ml_session=other`),
      fc.constant(`ml_session=other; ${alice.cookie}`),
    );
    await fc.assert(
      fc.asyncProperty(cookie, rawBody, async (c, raw) => {
        const out = await probe(t, { ...requestWithRaw({ method: 'POST', path: '/api/auth/signout' }, raw), cookie: c });
        expect([204, 400, 413, 415]).toContain(out);
        const me = await rawRequest(server.url, { method: 'GET', path: '/api/me', cookie: c });
        expect(me.status).toBeLessThan(500);
        if (me.status === 200) expect((me.json as { id: string }).id).toBe(alice.id);
        else expect(me.status).toBe(401);
      }),
      runs(805, 60),
    );
  });
});
