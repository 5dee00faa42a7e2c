/**
 * Security headers (helmet) with a content security policy the built client satisfies: scripts and
 * styles only from the server itself (no inline script, no inline style element, no eval), the engine
 * worker from the server or a `blob:` URL, images and fonts from the server or `data:` URLs (Vite
 * inlines small assets), and fetch/WebSocket connections to the server only (`'self'` plus the
 * explicit ws:/wss: origin of the host, for browsers whose `'self'` does not cover WebSockets).
 *
 * Checked against `dist/client` after `npx vite build`: index.html has no inline script or style, the
 * bundle uses no eval, and styles are set through the CSSOM (which a CSP does not restrict).
 */
import type { IncomingMessage } from 'node:http';
import type { RequestHandler } from 'express';
import helmet from 'helmet';
import type { Config } from '../config';

/** A Host header we are willing to copy into the policy: a name or address and an optional port. */
const SAFE_HOST = /^(?:[a-z0-9](?:[a-z0-9-]{0,62}[a-z0-9])?(?:\.[a-z0-9](?:[a-z0-9-]{0,62}[a-z0-9])?)*|\[[0-9a-f:.]+\])(?::\d{1,5})?$/i;

/** `ws://host` and `wss://host` for a request's Host header, or nothing for an odd one. */
export function socketOriginsFor(host: string | undefined): string[] {
  if (!host || host.length > 260 || !SAFE_HOST.test(host)) return [];
  const h = host.toLowerCase();
  return [`ws://${h}`, `wss://${h}`];
}

/** The ws(s) origin of PUBLIC_URL (the address users type), when set. */
export function publicSocketOrigins(publicUrl: string | undefined): string[] {
  if (!publicUrl) return [];
  try {
    const u = new URL(publicUrl);
    return socketOriginsFor(u.host);
  } catch {
    return [];
  }
}

type DirectiveValue = string | ((req: IncomingMessage, res: unknown) => string);

/** The policy's directives (exported for tests and for the README). */
export function cspDirectives(
  config: Pick<Config, 'nodeEnv' | 'publicUrl'>,
): Record<string, DirectiveValue[] | null> {
  const fixedSockets = publicSocketOrigins(config.publicUrl);
  return {
    'default-src': ["'self'"],
    'script-src': ["'self'"],
    'script-src-attr': ["'none'"],
    'style-src': ["'self'"],
    'img-src': ["'self'", 'data:', 'blob:'],
    'font-src': ["'self'", 'data:'],
    'worker-src': ["'self'", 'blob:'],
    'connect-src': [
      "'self'",
      ...fixedSockets,
      // The socket origin of the host this page was served from (only a well-formed Host is copied).
      (req) => socketOriginsFor(req.headers.host).join(' ') || "'self'",
    ],
    'manifest-src': ["'self'"],
    'media-src': ["'self'", 'blob:'],
    'object-src': ["'none'"],
    'base-uri': ["'self'"],
    'form-action': ["'self'"],
    'frame-ancestors': ["'none'"],
    'upgrade-insecure-requests': config.nodeEnv === 'production' ? [] : null,
  };
}

/** helmet with the policy above; HSTS only in production (plain http on loopback otherwise). */
export function securityHeaders(config: Pick<Config, 'nodeEnv' | 'publicUrl'>): RequestHandler {
  return helmet({
    contentSecurityPolicy: { useDefaults: false, directives: cspDirectives(config) },
    // Same-origin only; nothing is embedded cross-origin, and COEP would only get in the way of data: fonts.
    crossOriginEmbedderPolicy: false,
    crossOriginOpenerPolicy: { policy: 'same-origin' },
    crossOriginResourcePolicy: { policy: 'same-origin' },
    referrerPolicy: { policy: 'no-referrer' },
    strictTransportSecurity:
      config.nodeEnv === 'production' ? { maxAge: 180 * 24 * 60 * 60, includeSubDomains: true } : false,
    xFrameOptions: { action: 'deny' },
  });
}

/** API answers hold private data: never store them in a shared or browser cache. */
export const noStoreForApi: RequestHandler = (req, res, next) => {
  if (req.originalUrl.startsWith('/api/') || req.originalUrl === '/api') res.setHeader('Cache-Control', 'no-store');
  next();
};
