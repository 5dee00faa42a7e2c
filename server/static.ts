/**
 * The built client (dist/client): static files, and index.html for any other GET that is not an API or
 * socket path (the single-page app's own routes).
 */
import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import express, { type RequestHandler, Router } from 'express';

export const DEFAULT_CLIENT_DIR = resolve('dist/client');

const NOT_APP = /^\/(api|collab|socket\.io)(\/|$)/;

export function clientRoutes(clientDir: string): Router | null {
  const index = join(clientDir, 'index.html');
  if (!existsSync(index)) return null;
  const r = Router();
  r.use(
    express.static(clientDir, {
      index: false,
      setHeaders(res, path) {
        // Hashed assets can be cached for good; everything else is revalidated.
        if (path.includes(`${join(clientDir, 'assets')}`))
          res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
      },
    }),
  );
  const fallback: RequestHandler = (req, res, next) => {
    if ((req.method !== 'GET' && req.method !== 'HEAD') || NOT_APP.test(req.path)) return next();
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(index);
  };
  r.use(fallback);
  return r;
}
