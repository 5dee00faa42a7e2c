/**
 * A cross-site write guard for cookie-authenticated requests: a POST, PUT, PATCH or DELETE whose Origin
 * header is present must name this server's own host (or PUBLIC_URL's). A request without an Origin
 * (same-origin older browsers, curl, tests) passes; SameSite=Lax on the cookie covers the rest.
 */
import type { RequestHandler } from 'express';
import { HttpError } from '../errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

export function originCheck(publicUrl?: string): RequestHandler {
  const publicHost = publicUrl ? new URL(publicUrl).host.toLowerCase() : null;
  return (req, _res, next) => {
    const origin = req.get('origin');
    if (SAFE_METHODS.has(req.method) || origin === undefined) return next();
    let originHost: string | null;
    try {
      originHost = new URL(origin).host.toLowerCase();
    } catch {
      originHost = null; // "null" (sandboxed frame, file:) or garbage
    }
    const ownHost = (req.get('host') ?? '').toLowerCase();
    if (originHost && (originHost === ownHost || originHost === publicHost)) return next();
    next(new HttpError(403, 'bad-origin', 'Requests from another site are refused.'));
  };
}
