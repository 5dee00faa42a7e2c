import { Router } from 'express';

/** `{ ok: true }` once the database is migrated and the server listens; 503 before that and while closing. */
export function healthRoutes(isReady: () => boolean): Router {
  const r = Router();
  r.get('/health', (_req, res) => {
    if (isReady()) res.json({ ok: true });
    else res.status(503).json({ error: { code: 'not-ready', message: 'The server is starting or shutting down.' } });
  });
  return r;
}
