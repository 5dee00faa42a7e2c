// securityMiddleware (server/security): the headers and content security policy, no-store on API answers,
// and the sign-in, sign-up and invitation rate limits, on a small Express app arranged as README says the
// real one mounts it (at the root, before the JSON parser and the routes, after `trust proxy`).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import express from 'express';
import { securityMiddleware, type SecurityOptions } from '../../server/security/index';
import { DEFAULT_RATE_LIMITS } from '../../server/security/rate-limits';
import { isErrorShape, rawRequest } from './helpers/http';
import type { Config } from '../../server/config';

interface Mini {
  url: string;
  close(): Promise<void>;
  signinBodies: unknown[];
}

/** The real app's order: trust proxy, security middleware, JSON parser, routes, error handler. */
async function miniApp(config: Pick<Config, 'nodeEnv' | 'publicUrl'>, options?: SecurityOptions): Promise<Mini> {
  const app = express();
  app.set('trust proxy', 'loopback');
  app.use(securityMiddleware(config, options));
  app.use(express.json({ limit: '2mb' }));
  const signinBodies: unknown[] = [];
  app.post('/api/auth/signin', (req, res) => {
    signinBodies.push(req.body);
    if ((req.body as { password?: string }).password === 'right password') res.json({ ok: true });
    else res.status(401).json({ error: { code: 'bad-credentials', message: 'no' } });
  });
  app.post('/api/auth/signup', (_req, res) => {
    res.status(201).json({ ok: true });
  });
  app.post('/api/rooms/:id/members', (_req, res) => {
    res.status(202).json({ invited: true });
  });
  app.post('/api/rooms/:id/invitations/:invitationId/resend', (_req, res) => {
    res.status(202).json({ resent: true });
  });
  app.get('/api/rooms', (_req, res) => {
    res.json([]);
  });
  app.get('/', (_req, res) => {
    res.type('html').send('<!doctype html><title>x</title>');
  });
  app.use(((err, _req, res, _next) => {
    const e = err as { type?: string; status?: number };
    res.status(e.type === 'entity.parse.failed' ? 400 : (e.status ?? 500)).json({ error: { code: 'bad-json', message: 'bad' } });
  }) as express.ErrorRequestHandler);
  const server = http.createServer(app);
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  return {
    url: `http://127.0.0.1:${(server.address() as AddressInfo).port}`,
    signinBodies,
    close: () => new Promise<void>((r) => server.close(() => r())),
  };
}

function csp(res: { headers: http.IncomingHttpHeaders }): Map<string, string[]> {
  const header = String(res.headers['content-security-policy'] ?? '');
  return new Map(
    header
      .split(';')
      .map((d) => d.trim().split(/\s+/))
      .filter((d) => d[0])
      .map(([name, ...values]) => [name, values]),
  );
}

describe('security headers', () => {
  let mini: Mini;
  beforeAll(async () => {
    mini = await miniApp({ nodeEnv: 'production', publicUrl: 'https://matchloom.example.test' });
  });
  afterAll(() => mini.close());

  it('a content security policy the built client satisfies, with nothing inline and no eval', async () => {
    const res = await rawRequest(mini.url, { method: 'GET', path: '/', headers: { host: 'app.example.test:8443' } });
    const d = csp(res);
    expect(d.get('default-src')).toEqual(["'self'"]);
    expect(d.get('script-src')).toEqual(["'self'"]);
    expect(d.get('script-src-attr')).toEqual(["'none'"]);
    expect(d.get('style-src')).toEqual(["'self'"]);
    expect(d.get('worker-src')).toEqual(["'self'", 'blob:']);
    expect(d.get('img-src')).toEqual(["'self'", 'data:', 'blob:']);
    expect(d.get('font-src')).toEqual(["'self'", 'data:']);
    expect(d.get('object-src')).toEqual(["'none'"]);
    expect(d.get('frame-ancestors')).toEqual(["'none'"]);
    expect(d.get('base-uri')).toEqual(["'self'"]);
    expect(d.get('connect-src')).toEqual([
      "'self'",
      'ws://matchloom.example.test',
      'wss://matchloom.example.test',
      'ws://app.example.test:8443',
      'wss://app.example.test:8443',
    ]);
    expect(d.has('upgrade-insecure-requests')).toBe(true);
    const all = String(res.headers['content-security-policy']);
    expect(all).not.toContain('unsafe-inline');
    expect(all).not.toContain('unsafe-eval');
    expect(res.headers['strict-transport-security']).toMatch(/max-age=\d+/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-frame-options']).toBe('DENY');
    expect(res.headers['referrer-policy']).toBe('no-referrer');
    expect(res.headers['cross-origin-opener-policy']).toBe('same-origin');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('a hostile Host header is not copied into the policy', async () => {
    for (const host of ['evil.test; script-src *', "x' 'unsafe-inline", 'a b', 'x'.repeat(300)]) {
      const res = await rawRequest(mini.url, { method: 'GET', path: '/', headers: { host } });
      const all = String(res.headers['content-security-policy']);
      expect(all).not.toContain('unsafe-inline');
      expect(csp(res).get('script-src')).toEqual(["'self'"]);
      expect(csp(res).get('connect-src')).toEqual(["'self'", 'ws://matchloom.example.test', 'wss://matchloom.example.test', "'self'"]);
    }
  });

  it('API answers are never cached; HSTS and upgrade-insecure-requests only in production', async () => {
    const api = await rawRequest(mini.url, { method: 'GET', path: '/api/rooms' });
    expect(api.headers['cache-control']).toBe('no-store');
    const page = await rawRequest(mini.url, { method: 'GET', path: '/' });
    expect(page.headers['cache-control']).toBeUndefined();
    const dev = await miniApp({ nodeEnv: 'development' });
    try {
      const res = await rawRequest(dev.url, { method: 'GET', path: '/' });
      expect(res.headers['strict-transport-security']).toBeUndefined();
      expect(csp(res).has('upgrade-insecure-requests')).toBe(false);
      expect(csp(res).get('connect-src')?.[0]).toBe("'self'");
    } finally {
      await dev.close();
    }
  });
});

describe('rate limits', () => {
  const small = { signinPerIp: 6, signinPerIpAndEmail: 3, signinPerEmail: 4, signupPerIp: 3, invitationsPerIp: 4 };
  const from = (ip: string) => ({ 'x-forwarded-for': ip });
  const signin = (url: string, email: string, password: string, ip = '198.51.100.1') =>
    rawRequest(url, { method: 'POST', path: '/api/auth/signin', body: { email, password }, headers: from(ip) });

  it('are off in the test environment unless asked for', async () => {
    const mini = await miniApp({ nodeEnv: 'test' });
    try {
      for (let i = 0; i < DEFAULT_RATE_LIMITS.signinPerIpAndEmail + 5; i++)
        expect((await signin(mini.url, 'a@example.test', 'wrong')).status).toBe(401);
    } finally {
      await mini.close();
    }
  });

  describe('when on', () => {
    let mini: Mini;
    beforeAll(async () => {
      mini = await miniApp({ nodeEnv: 'test' }, { rateLimits: true, limits: small });
    });
    afterAll(() => mini.close());

    it('sign-in: failures per client and address are braked with 429 in the error shape; the body still reaches the route', async () => {
      for (let i = 0; i < 3; i++) expect((await signin(mini.url, 'bob@example.test', 'wrong')).status).toBe(401);
      const refused = await signin(mini.url, 'Bob@Example.test ', 'wrong');
      expect(refused.status).toBe(429);
      expect(isErrorShape(refused.json)).toBe(true);
      expect((refused.json as { error: { code: string } }).error.code).toBe('too-many-requests');
      expect(refused.headers['retry-after']).toMatch(/^\d+$/);
      expect(String(refused.headers.ratelimit ?? '')).toMatch(/r=0/);
      // Even the right password waits: the brake is on the pair, not on the outcome.
      expect((await signin(mini.url, 'bob@example.test', 'right password')).status).toBe(429);
      // Another address from the same client is not braked yet; the route got the parsed body.
      expect((await signin(mini.url, 'carol@example.test', 'right password')).status).toBe(200);
      expect(mini.signinBodies.at(-1)).toEqual({ email: 'carol@example.test', password: 'right password' });
    });

    it('sign-in: successful sign-ins do not count', async () => {
      for (let i = 0; i < 8; i++) expect((await signin(mini.url, 'dora@example.test', 'right password', '198.51.100.2')).status).toBe(200);
    });

    it('sign-in: one address guessed from many clients is braked per e-mail', async () => {
      const statuses: number[] = [];
      for (let i = 0; i < 6; i++) statuses.push((await signin(mini.url, 'erin@example.test', 'wrong', `203.0.113.${10 + i}`)).status);
      expect(statuses).toEqual([401, 401, 401, 401, 429, 429]);
    });

    it('sign-in: one client spraying many addresses is braked per client', async () => {
      const statuses: number[] = [];
      for (let i = 0; i < 8; i++) statuses.push((await signin(mini.url, `spray${i}@example.test`, 'wrong', '192.0.2.99')).status);
      expect(statuses.slice(0, 6)).toEqual([401, 401, 401, 401, 401, 401]);
      expect(statuses.slice(6)).toEqual([429, 429]);
    });

    it('sign-in: path tricks (case, trailing slash) do not dodge the brake; bad JSON is still a 400', async () => {
      const ip = '192.0.2.50';
      for (const path of ['/api/auth/signin', '/API/auth/signin', '/api/auth/signin/'])
        await rawRequest(mini.url, { method: 'POST', path, body: { email: 'fay@example.test', password: 'x' }, headers: from(ip) });
      expect((await signin(mini.url, 'fay@example.test', 'x', ip)).status).toBe(429);
      const bad = await rawRequest(mini.url, { method: 'POST', path: '/api/auth/signin', body: '{"email":', headers: from('192.0.2.51') });
      expect(bad.status).toBe(400);
    });

    it('sign-up: every attempt counts per client', async () => {
      const statuses: number[] = [];
      for (let i = 0; i < 5; i++)
        statuses.push((await rawRequest(mini.url, { method: 'POST', path: '/api/auth/signup', body: {}, headers: from('192.0.2.7') })).status);
      expect(statuses).toEqual([201, 201, 201, 429, 429]);
      expect((await rawRequest(mini.url, { method: 'POST', path: '/api/auth/signup', body: {}, headers: from('192.0.2.8') })).status).toBe(201);
    });

    it('invitations: adding members and re-sending invitations share one brake per client', async () => {
      const statuses: number[] = [];
      for (let i = 0; i < 3; i++)
        statuses.push((await rawRequest(mini.url, { method: 'POST', path: `/api/rooms/r${i}/members`, body: {}, headers: from('192.0.2.9') })).status);
      for (let i = 0; i < 2; i++)
        statuses.push((await rawRequest(mini.url, { method: 'POST', path: `/api/rooms/r/invitations/i${i}/resend`, body: {}, headers: from('192.0.2.9') })).status);
      expect(statuses).toEqual([202, 202, 202, 202, 429]);
      // Reading is not braked.
      expect((await rawRequest(mini.url, { method: 'GET', path: '/api/rooms', headers: from('192.0.2.9') })).status).toBe(200);
    });

    it('IPv6 clients are grouped by /56, so rotating the last bits does not help', async () => {
      const statuses: number[] = [];
      for (let i = 0; i < 5; i++)
        statuses.push((await rawRequest(mini.url, { method: 'POST', path: '/api/auth/signup', body: {}, headers: from(`2001:db8:1:2${i}::${i + 1}`) })).status);
      expect(statuses).toEqual([201, 201, 201, 429, 429]);
    });
  });
});
