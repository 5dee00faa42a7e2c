/**
 * The local fake mail server's mailbox, for development and tests (mounted only outside production):
 * `GET /api/dev/mailbox` lists what it received, newest first; `DELETE` empties it.
 */
import { Router } from 'express';
import { notFound } from '../errors';
import type { AppDeps } from '../app';

export function devMailboxRoutes({ mailer }: AppDeps): Router {
  const r = Router();
  const box = () => {
    if (!mailer.mailbox)
      throw notFound('There is no local mailbox: SMTP_URL is set, so mail goes to that server.');
    return mailer.mailbox;
  };

  r.get('/dev/mailbox', (_req, res) => {
    res.json(box().messages());
  });

  r.delete('/dev/mailbox', (_req, res) => {
    box().clear();
    res.status(204).end();
  });

  return r;
}
