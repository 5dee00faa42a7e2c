/**
 * Errors the API answers with: `{ error: { code, message } }` and a 4xx status. Route code throws an
 * `HttpError`; the central handler (app.ts) maps it, zod and body-parser failures, and anything else
 * (logged, answered 500 without details).
 */
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { DesignError } from '../shared/rf/design';
import type { Logger } from './logger';

export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly extra: Record<string, unknown> = {},
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

export const badRequest = (message: string, extra?: Record<string, unknown>) =>
  new HttpError(400, 'invalid-input', message, extra);
export const unauthenticated = (message = 'Sign in first.') => new HttpError(401, 'unauthenticated', message);
export const forbidden = (message = 'Your role in this room does not allow that.') =>
  new HttpError(403, 'forbidden', message);
export const notFound = (message = 'Not found.') => new HttpError(404, 'not-found', message);
export const conflict = (code: string, message: string) => new HttpError(409, code, message);

/** A design that does not parse, as a 400 naming the JSON path (with `prefix`, e.g. "design"). */
export function designHttpError(e: DesignError, prefix = ''): HttpError {
  const path = prefix ? (e.path ? `${prefix}.${e.path}` : prefix) : e.path;
  return new HttpError(400, 'invalid-design', path ? `${path}: ${e.reason}` : e.reason, { path });
}

interface BodyParserError {
  type?: string;
  status?: number;
  statusCode?: number;
  expose?: boolean;
  message?: string;
  limit?: number;
}

/** The final error handler: never a stack trace, never a 500 for the caller's mistake. */
export function errorHandler(logger: Logger): ErrorRequestHandler {
  return (err, req, res, next) => {
    if (res.headersSent) return next(err);
    let status = 500;
    let body: Record<string, unknown> = { code: 'internal', message: 'Something went wrong on the server.' };
    if (err instanceof HttpError) {
      status = err.status;
      body = { ...err.extra, code: err.code, message: err.message };
    } else if (err instanceof DesignError) {
      status = 400;
      body = { code: 'invalid-design', message: err.message, path: err.path };
    } else if (err && typeof err === 'object') {
      const e = err as BodyParserError;
      const s = e.status ?? e.statusCode;
      if (e.type === 'entity.parse.failed') {
        status = 400;
        body = { code: 'bad-json', message: 'The request body is not valid JSON.' };
      } else if (e.type === 'entity.too.large') {
        status = 413;
        body = {
          code: 'too-large',
          message: `The request body is larger than the limit${e.limit ? ` of ${e.limit} bytes` : ''}.`,
        };
      } else if (err instanceof URIError) {
        status = 400;
        body = { code: 'bad-request', message: 'The address is not validly encoded.' };
      } else if (typeof s === 'number' && s >= 400 && s < 500) {
        // body-parser and the router's own refusals (bad charset or encoding, a malformed path, ...)
        status = s;
        body = {
          code: 'bad-request',
          message: e.expose && e.message ? e.message : 'The request could not be read.',
        };
      }
    }
    if (status >= 500) (req.log ?? logger).error({ err }, 'request failed');
    res.status(status).json({ error: body });
  };
}

/** Unknown /api routes: a JSON 404, never the single-page app. */
export const apiNotFound: RequestHandler = (_req, _res, next) => next(notFound('No such API route.'));
