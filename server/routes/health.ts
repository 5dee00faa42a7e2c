import { Router } from 'express';

/**
 * `{ ok: true }` once the database is migrated and the server listens; 503 before that and while closing.
 * Outside production, `demo: true` is added when the demo accounts exist, so the sign-in page can list them.
 */
export function healthRoutes(isReady: () => boolean, demoAccounts: () => boolean): Router {
  const r = Router();
  r.get('/health', (_req, res) => {
    if (isReady()) res.json(demoAccounts() ? { ok: true, demo: true } : { ok: true });
    else
      res
        .status(503)
        .json({ error: { code: 'not-ready', message: 'The server is starting or shutting down.' } });
  });
  return r;
}
