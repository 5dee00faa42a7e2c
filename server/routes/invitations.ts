/** Invitation links: see what one offers (anyone holding it), and accept it (signed in, once). */
import { Router } from 'express';
import { signedInUser } from '../auth/session';
import { acceptInvitation, previewInvitation } from '../services/invitations';
import type { AppDeps } from '../app';

export function invitationRoutes({ knex, events }: AppDeps): Router {
  const r = Router();

  r.get('/invitations/:token', async (req, res) => {
    res.json(await previewInvitation(knex, req.params.token));
  });

  r.post('/invitations/:token/accept', async (req, res) => {
    const user = signedInUser(req);
    const result = await acceptInvitation(knex, req.params.token, user);
    if (!result.alreadyMember) events.roleChanged(result.roomId, user.id, result.role);
    res.json(result);
  });

  return r;
}
