/**
 * A brake on password guessing: after 10 failed sign-ins for one address from one client within 15
 * minutes, further attempts get 429 until the window passes. Successful sign-ins do not count. Off in
 * the test environment, where many accounts sign in from one address in a few seconds.
 */
import type { RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';

export const SIGNIN_WINDOW_MS = 15 * 60 * 1000;
export const SIGNIN_MAX_FAILURES = 10;

export function signinLimiter(enabled: boolean): RequestHandler {
  if (!enabled) return (_req, _res, next) => next();
  return rateLimit({
    windowMs: SIGNIN_WINDOW_MS,
    limit: SIGNIN_MAX_FAILURES,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => {
      const body = req.body as { email?: unknown } | undefined;
      const email = typeof body?.email === 'string' ? body.email.trim().toLowerCase().slice(0, 320) : '';
      return `${ipKeyGenerator(req.ip ?? '')}|${email}`;
    },
    handler: (_req, res) => {
      res.status(429).json({
        error: {
          code: 'too-many-attempts',
          message: 'Too many failed sign-ins. Wait a few minutes and try again.',
        },
      });
    },
  });
}
