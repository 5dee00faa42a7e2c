/**
 * Brakes on the routes worth abusing (express-rate-limit, in-memory store per process):
 *
 * - sign-in: failed attempts per client address, per (address, e-mail) and per e-mail from anywhere;
 *   successful sign-ins do not count. The per-e-mail brake slows guessing spread over many addresses
 *   while staying high enough that a stranger cannot lock an engineer out with a few wrong passwords.
 * - sign-up: every attempt per client address (account farming, hash-cost exhaustion).
 * - invitations: adding members and sending or re-sending invitations, per client address (mail flood,
 *   and probing which addresses have accounts).
 *
 * Each limiter matches its own method and path against `req.originalUrl`, so the array can be mounted at
 * the app's root. Refusals are 429 `{ error: { code: 'too-many-requests', message } }` with the
 * draft-8 `RateLimit` and `Retry-After` headers. Client addresses come from `req.ip` (the app trusts
 * only a loopback proxy), with IPv6 grouped by /56 as express-rate-limit advises.
 */
import express, { type Request, type RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';

export interface RateLimitSettings {
  windowMs: number;
  /** failed sign-ins per client address per window. */
  signinPerIp: number;
  /** failed sign-ins per (client address, e-mail) per window. */
  signinPerIpAndEmail: number;
  /** failed sign-ins per e-mail address, from any client, per window. */
  signinPerEmail: number;
  /** sign-up attempts per client address per window. */
  signupPerIp: number;
  /** member additions and invitations per client address per window. */
  invitationsPerIp: number;
  /** largest JSON body the sign-in brake reads to learn the e-mail (keep equal to the app's JSON limit). */
  jsonLimit: string;
}

export const DEFAULT_RATE_LIMITS: RateLimitSettings = {
  windowMs: 15 * 60 * 1000,
  signinPerIp: 100,
  signinPerIpAndEmail: 10,
  signinPerEmail: 50,
  signupPerIp: 20,
  invitationsPerIp: 60,
  jsonLimit: '2mb',
};

export const TOO_MANY_MESSAGE = 'Too many attempts from here. Wait a few minutes and try again.';

function pathOf(req: Request): string {
  const q = req.originalUrl.indexOf('?');
  const raw = q < 0 ? req.originalUrl : req.originalUrl.slice(0, q);
  // Collapse repeated slashes and a trailing slash so `/api//auth/signin/` cannot dodge the brake.
  return raw.replace(/\/{2,}/g, '/').replace(/(.)\/$/, '$1').toLowerCase();
}

const SIGNIN = /^\/api\/auth\/signin$/;
const SIGNUP = /^\/api\/auth\/signup$/;
/** POST /api/rooms/:id/members and anything under /api/rooms/:id/invitations (send, resend). */
const INVITATIONS = /^\/api\/rooms\/[^/]+\/(?:members|invitations)(?:\/[^/]+)*$/;

function only(method: string, path: RegExp, handler: RequestHandler): RequestHandler {
  return (req, res, next) => {
    if (req.method !== method || !path.test(pathOf(req))) return next();
    return handler(req, res, next);
  };
}

function clientKey(req: Request): string {
  return ipKeyGenerator(req.ip ?? 'unknown', 56);
}

function bodyEmail(req: Request): string {
  const body = req.body as { email?: unknown } | undefined;
  return typeof body?.email === 'string' ? body.email.trim().toLowerCase().slice(0, 320) : '';
}

function limiter(
  settings: RateLimitSettings,
  limit: number,
  key: (req: Request) => string,
  onlyFailures: boolean,
): RequestHandler {
  return rateLimit({
    windowMs: settings.windowMs,
    limit,
    keyGenerator: key,
    skipSuccessfulRequests: onlyFailures,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(429).json({ error: { code: 'too-many-requests', message: TOO_MANY_MESSAGE } });
    },
  });
}

/**
 * The sign-in, sign-up and invitation limiters, in order. The sign-in brake parses the JSON body itself
 * (only on that route) to key by e-mail; the app's own `express.json` then sees a finished request and
 * leaves `req.body` as it is.
 */
export function rateLimiters(overrides: Partial<RateLimitSettings> = {}): RequestHandler[] {
  const s = { ...DEFAULT_RATE_LIMITS, ...overrides };
  const json = express.json({ limit: s.jsonLimit });
  const signin = [
    json,
    limiter(s, s.signinPerIp, (req) => `ip|${clientKey(req)}`, true),
    limiter(s, s.signinPerIpAndEmail, (req) => `ip+email|${clientKey(req)}|${bodyEmail(req)}`, true),
    limiter(s, s.signinPerEmail, (req) => `email|${bodyEmail(req)}`, true),
  ];
  return [
    ...signin.map((h) => only('POST', SIGNIN, h)),
    only('POST', SIGNUP, limiter(s, s.signupPerIp, (req) => `ip|${clientKey(req)}`, false)),
    only('POST', INVITATIONS, limiter(s, s.invitationsPerIp, (req) => `ip|${clientKey(req)}`, false)),
  ];
}
