/**
 * Hardening for the HTTP side, as one array of Express middleware to mount at the app's root (see
 * server/security/README.md for where): security headers with the content security policy, `no-store`
 * on API answers, and the sign-in, sign-up and invitation rate limits.
 *
 * Rate limits are off when `config.nodeEnv === 'test'` (many accounts sign in from one address within
 * seconds there) unless `options.rateLimits` is true, which the tests of the limits themselves use.
 */
import type { RequestHandler } from 'express';
import type { Config } from '../config';
import { noStoreForApi, securityHeaders } from './csp';
import { rateLimiters, type RateLimitSettings } from './rate-limits';

export interface SecurityOptions {
  /** Force the rate limits on (true) or off (false); default: on unless `nodeEnv` is 'test'. */
  rateLimits?: boolean;
  /** Limits and window (tests shrink them). */
  limits?: Partial<RateLimitSettings>;
}

export function securityMiddleware(
  config: Pick<Config, 'nodeEnv' | 'publicUrl'>,
  options: SecurityOptions = {},
): RequestHandler[] {
  const limitsOn = options.rateLimits ?? config.nodeEnv !== 'test';
  return [securityHeaders(config), noStoreForApi, ...(limitsOn ? rateLimiters(options.limits) : [])];
}

export { cspDirectives, socketOriginsFor } from './csp';
export { DEFAULT_RATE_LIMITS, TOO_MANY_MESSAGE, type RateLimitSettings } from './rate-limits';
