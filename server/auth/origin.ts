/**
 * A cross-site write guard for cookie-authenticated requests: a POST, PUT, PATCH or DELETE whose Origin
 * header is present must name this server's own host (the Host header, a loopback proxy's
 * X-Forwarded-Host, or PUBLIC_URL's host). A request without an Origin (curl, tests, older same-origin
 * browsers) passes; SameSite=Lax on the cookie covers the rest.
 *
 * In development any loopback origin (localhost, 127.0.0.1, [::1], any port) is accepted too: Vite's dev
 * server proxies /api with `changeOrigin`, so the API sees its own Host but the browser's Origin is the
 * Vite port.
 */
import type { RequestHandler } from 'express';
import { HttpError } from '../errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
const LOOPBACK_HOSTNAMES = new Set(['localhost', '127.0.0.1', '[::1]']);

export function originCheck(
  options: { publicUrl?: string; allowLoopbackOrigins?: boolean } = {},
): RequestHandler {
  const publicHost = options.publicUrl ? new URL(options.publicUrl).host.toLowerCase() : null;
  return (req, _res, next) => {
    const origin = req.get('origin');
    if (SAFE_METHODS.has(req.method) || origin === undefined) return next();
    let url: URL | null;
    try {
      url = new URL(origin);
    } catch {
      url = null; // "null" (sandboxed frame, file:) or garbage
    }
    if (url) {
      const host = url.host.toLowerCase();
      const own = new Set([(req.get('host') ?? '').toLowerCase(), publicHost]);
      // Only a proxy on this machine may name the host the browser used (trust proxy: loopback).
      const forwarded = req.get('x-forwarded-host');
      if (forwarded && req.ip && /^(127\.|::1$|::ffff:127\.)/.test(req.ip))
        own.add(forwarded.split(',')[0].trim().toLowerCase());
      if (own.has(host)) return next();
      if (options.allowLoopbackOrigins && LOOPBACK_HOSTNAMES.has(url.hostname.toLowerCase())) return next();
    }
    next(new HttpError(403, 'bad-origin', 'Requests from another site are refused.'));
  };
}
