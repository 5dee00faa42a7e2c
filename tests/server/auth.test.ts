import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SESSION_COOKIE } from '../../server/auth/tokens';
import { TEST_PASSWORD, signUp, startTestServer, uniqueEmail, type TestServer } from './helpers/test-server';

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterAll(async () => {
  await server.close();
});

function sessionCookie(setCookie: string[] | string | undefined): string {
  const all = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  const c = all.find((v) => v.startsWith(`${SESSION_COOKIE}=`));
  if (!c) throw new Error(`no ${SESSION_COOKIE} cookie in ${JSON.stringify(all)}`);
  return c;
}

describe('POST /api/auth/signup', () => {
  it('creates the account, answers 201 and sets an httpOnly, SameSite=Lax session cookie on /', async () => {
    const agent = server.agent();
    const res = await agent
      .post('/api/auth/signup')
      .send({ email: '  Ada.Engineer@Example.TEST ', password: TEST_PASSWORD, displayName: ' Ada ' })
      .expect(201);
    expect(res.body).toEqual({
      id: expect.any(String),
      email: 'ada.engineer@example.test',
      displayName: 'Ada',
    });
    expect(res.body).not.toHaveProperty('passwordHash');
    const cookie = sessionCookie(res.headers['set-cookie']);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).toMatch(/Path=\//);
    expect(cookie).toMatch(/Max-Age=604800/);
    expect(cookie).not.toMatch(/Secure/i); // only in production
    const me = await agent.get('/api/me').expect(200);
    expect(me.body).toEqual({ ...res.body, notifyReviews: true });
  });

  it('refuses a second account for the same address (any case) with 409 and a discreet message', async () => {
    const email = uniqueEmail('dup');
    await signUp(server, { email });
    const res = await server
      .agent()
      .post('/api/auth/signup')
      .send({ email: email.toUpperCase(), password: TEST_PASSWORD, displayName: 'B' })
      .expect(409);
    expect(res.body.error.code).toBe('email-taken');
    expect(res.body.error.message).not.toContain(email);
    expect(res.headers['set-cookie']).toBeUndefined();
  });

  it.each([
    [{ password: TEST_PASSWORD, displayName: 'A' }, 'email: is required'],
    [{ email: 'nobody', password: TEST_PASSWORD, displayName: 'A' }, 'email: must be a valid e-mail address'],
    [{ email: 42, password: TEST_PASSWORD, displayName: 'A' }, 'email: must be a string'],
    [{ email: 'a@example.test', displayName: 'A' }, 'password: is required'],
    [
      { email: 'a@example.test', password: 'short', displayName: 'A' },
      'password: must be at least 10 characters',
    ],
    [
      { email: 'a@example.test', password: 'é'.repeat(40), displayName: 'A' },
      'password: must be at most 72 bytes',
    ],
    [{ email: 'a@example.test', password: TEST_PASSWORD }, 'displayName: is required'],
    [
      { email: 'a@example.test', password: TEST_PASSWORD, displayName: '   ' },
      'displayName: must not be empty',
    ],
    [
      { email: 'a@example.test', password: TEST_PASSWORD, displayName: 'x'.repeat(81) },
      'displayName: must be at most 80 characters',
    ],
  ])('answers 400 naming the field for %o', async (body, message) => {
    const res = await server.agent().post('/api/auth/signup').send(body).expect(400);
    expect(res.body.error).toMatchObject({ code: 'invalid-input', message });
  });

  it('accepts a display name of exactly 80 characters and a password of exactly 10', async () => {
    await server
      .agent()
      .post('/api/auth/signup')
      .send({ email: uniqueEmail(), password: '0123456789', displayName: 'x'.repeat(80) })
      .expect(201);
  });
});

describe('POST /api/auth/signin', () => {
  it('signs in with the right password (e-mail in any case)', async () => {
    const { user } = await signUp(server);
    const agent = server.agent();
    const res = await agent
      .post('/api/auth/signin')
      .send({ email: user.email.toUpperCase(), password: TEST_PASSWORD })
      .expect(200);
    expect(res.body).toEqual(user);
    expect(sessionCookie(res.headers['set-cookie'])).toMatch(/HttpOnly/i);
    await agent.get('/api/me').expect(200);
  });

  it('answers 401 with the same message for a wrong password and an unknown address', async () => {
    const { user } = await signUp(server);
    const wrong = await server
      .agent()
      .post('/api/auth/signin')
      .send({ email: user.email, password: 'not the password' })
      .expect(401);
    const unknown = await server
      .agent()
      .post('/api/auth/signin')
      .send({ email: uniqueEmail('ghost'), password: 'not the password' })
      .expect(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe('bad-credentials');
    expect(wrong.headers['set-cookie']).toBeUndefined();
  });

  it('outside the test environment, brakes after 10 failures for one address (429), not for others', async () => {
    const dev = await startTestServer({ nodeEnv: 'development' });
    try {
      const res = await dev
        .agent()
        .post('/api/auth/signup')
        .send({ email: uniqueEmail(), password: TEST_PASSWORD, displayName: 'R' })
        .expect(201);
      const email = res.body.email as string;
      for (let i = 0; i < 10; i++)
        await dev.agent().post('/api/auth/signin').send({ email, password: 'wrong password!' }).expect(401);
      const braked = await dev
        .agent()
        .post('/api/auth/signin')
        .send({ email, password: TEST_PASSWORD })
        .expect(429);
      expect(braked.body.error.code).toBe('too-many-requests');
      await dev
        .agent()
        .post('/api/auth/signin')
        .send({ email: uniqueEmail(), password: 'wrong password!' })
        .expect(401);
    } finally {
      await dev.close();
    }
  });

  it('answers 400 for a missing field', async () => {
    const res = await server.agent().post('/api/auth/signin').send({ email: 'a@example.test' }).expect(400);
    expect(res.body.error.message).toBe('password: is required');
  });
});

describe('sessions', () => {
  it('GET /api/me is 401 without a cookie, with a garbage cookie, or after sign-out', async () => {
    expect((await server.agent().get('/api/me').expect(401)).body.error.code).toBe('unauthenticated');
    await server.agent().get('/api/me').set('Cookie', `${SESSION_COOKIE}=garbage`).expect(401);
    const { agent } = await signUp(server);
    const out = await agent.post('/api/auth/signout').expect(204);
    expect(sessionCookie(out.headers['set-cookie'])).toMatch(/Expires=Thu, 01 Jan 1970/);
    await agent.get('/api/me').expect(401);
  });

  it('a session of a deleted account no longer works', async () => {
    const { agent, user } = await signUp(server);
    await server.knex('users').where({ id: user.id }).delete();
    await agent.get('/api/me').expect(401);
  });

  it('a session signed with another secret is refused', async () => {
    const other = await startTestServer();
    try {
      const res = await other
        .agent()
        .post('/api/auth/signup')
        .send({ email: uniqueEmail(), password: TEST_PASSWORD, displayName: 'X' })
        .expect(201);
      const cookie = sessionCookie(res.headers['set-cookie']).split(';')[0];
      await server.agent().get('/api/me').set('Cookie', cookie).expect(401);
    } finally {
      await other.close();
    }
  });
});

describe('request bodies', () => {
  it('bad JSON is a 400, never a 500', async () => {
    const res = await server
      .agent()
      .post('/api/auth/signup')
      .set('Content-Type', 'application/json')
      .send('{"email": ')
      .expect(400);
    expect(res.body.error.code).toBe('bad-json');
  });

  it('a body that is not a JSON object is a 400', async () => {
    await server
      .agent()
      .post('/api/auth/signup')
      .set('Content-Type', 'application/json')
      .send('[1,2]')
      .expect(400);
    await server
      .agent()
      .post('/api/auth/signup')
      .set('Content-Type', 'application/json')
      .send('"text"')
      .expect(400);
    const res = await server
      .agent()
      .post('/api/auth/signup')
      .set('Content-Type', 'text/plain')
      .send('email=a')
      .expect(400);
    expect(res.body.error.message).toMatch(/JSON object/);
  });

  it('a huge body is a 413', async () => {
    const res = await server
      .agent()
      .post('/api/auth/signup')
      .send({ email: 'a@example.test', password: TEST_PASSWORD, displayName: 'x'.repeat(3 * 1024 * 1024) })
      .expect(413);
    expect(res.body.error.code).toBe('too-large');
  });

  it('an unreadable body or address is a 4xx with the error shape, never a 500', async () => {
    const { agent } = await signUp(server);
    const gz = await agent
      .post('/api/rooms')
      .set('Content-Type', 'application/json')
      .set('Content-Encoding', 'gzip')
      .send('not gzip')
      .expect(400);
    expect(gz.body.error.code).toBe('bad-request');
    const charset = await agent
      .post('/api/rooms')
      .set('Content-Type', 'application/json; charset=latin-9')
      .send('{"name":"x"}')
      .expect(415);
    expect(charset.body.error.code).toBe('bad-request');
    expect((await agent.get('/api/rooms/%E0%A4%A').expect(400)).body.error.code).toBe('bad-request');
    expect(
      (await agent.post('/api/rooms').set('Content-Type', 'application/json').send('null').expect(400)).body
        .error.code,
    ).toBe('bad-json');
  });

  it('an unknown API route is a JSON 404', async () => {
    const res = await server.agent().get('/api/nothing-here').expect(404);
    expect(res.body.error.code).toBe('not-found');
  });
});

describe('cross-site writes', () => {
  it('refuses a write whose Origin is another site, allows its own origin and no origin', async () => {
    const { agent } = await signUp(server);
    const res = await agent
      .post('/api/rooms')
      .set('Origin', 'https://evil.example')
      .send({ name: 'x' })
      .expect(403);
    expect(res.body.error.code).toBe('bad-origin');
    await agent.post('/api/rooms').set('Origin', 'null').send({ name: 'x' }).expect(403);
    await agent.post('/api/rooms').set('Origin', server.url).send({ name: 'same origin' }).expect(201);
    await agent.post('/api/rooms').send({ name: 'no origin' }).expect(201);
    // Reads are not affected.
    await agent.get('/api/rooms').set('Origin', 'https://evil.example').expect(200);
    // Another port of this machine is another site outside development.
    await agent.post('/api/rooms').set('Origin', 'http://localhost:5173').send({ name: 'x' }).expect(403);
    // A proxy on this machine may say which host the browser used.
    await agent
      .post('/api/rooms')
      .set('Origin', 'https://front.example.test')
      .set('X-Forwarded-Host', 'front.example.test')
      .send({ name: 'proxied' })
      .expect(201);
  });

  it('accepts PUBLIC_URL, and in development any loopback origin (the Vite dev server)', async () => {
    const dev = await startTestServer({
      nodeEnv: 'development',
      publicUrl: 'https://matchloom.example.test',
    });
    try {
      const body = { email: uniqueEmail(), password: TEST_PASSWORD, displayName: 'D' };
      await dev
        .agent()
        .post('/api/auth/signup')
        .set('Origin', 'https://matchloom.example.test')
        .send(body)
        .expect(201);
      await dev
        .agent()
        .post('/api/auth/signin')
        .set('Origin', 'http://localhost:5173')
        .send(body)
        .expect(200);
      await dev
        .agent()
        .post('/api/auth/signin')
        .set('Origin', 'http://127.0.0.1:5173')
        .send(body)
        .expect(200);
      await dev.agent().post('/api/auth/signin').set('Origin', 'https://evil.example').send(body).expect(403);
    } finally {
      await dev.close();
    }
  });
});

describe('in production', () => {
  it('the session cookie is Secure', async () => {
    const prod = await startTestServer({ nodeEnv: 'production' });
    try {
      const res = await prod
        .agent()
        .post('/api/auth/signup')
        .send({ email: uniqueEmail(), password: TEST_PASSWORD, displayName: 'P' })
        .expect(201);
      expect(sessionCookie(res.headers['set-cookie'])).toMatch(/;\s*Secure/i);
    } finally {
      await prod.close();
    }
  });
});
