/** Room members: list, add or invite, change a role, remove (or leave). */
import { Router } from 'express';
import { signedInUser } from '../auth/session';
import { notFound } from '../errors';
import { requireRoomRole } from '../rooms/access';
import { addMember, changeRole, listInvitations, removeMember } from '../services/members';
import { listMembers } from '../services/rooms';
import { bodyObject, check, emailSchema, idParam, roleSchema } from '../validate';
import { appBaseUrl, invitationLink } from '../links';
import { invitationMail } from '../mail/messages';
import type { AppDeps } from '../app';

const addBody = bodyObject({ email: emailSchema, role: roleSchema });
const roleBody = bodyObject({ role: roleSchema });

function memberId(v: unknown): string {
  const r = idParam.safeParse(v);
  if (!r.success) throw notFound('That user is not a member of this room.');
  return r.data;
}

export function memberRoutes({ knex, events, mailer, config, logger }: AppDeps): Router {
  const r = Router();

  r.get('/rooms/:id/members', async (req, res) => {
    const { roomId } = await requireRoomRole(knex, req.params.id, signedInUser(req).id);
    res.json(await listMembers(knex, roomId));
  });

  r.get('/rooms/:id/invitations', async (req, res) => {
    const { roomId } = await requireRoomRole(knex, req.params.id, signedInUser(req).id, ['owner']);
    res.json(await listInvitations(knex, roomId));
  });

  r.post('/rooms/:id/members', async (req, res) => {
    const user = signedInUser(req);
    const { roomId } = await requireRoomRole(knex, req.params.id, user.id, ['owner']);
    const body = check(addBody, req.body);
    const result = await addMember(knex, { roomId, email: body.email, role: body.role, invitedBy: user.id });
    if (result.kind === 'added') {
      events.roleChanged(roomId, result.member.userId, result.member.role);
      res.status(201).json(result.member);
    } else {
      const room = await knex('rooms').where({ id: roomId }).first('name');
      let mailSent = true;
      try {
        await mailer.send(
          invitationMail({
            to: result.invitation.email,
            roomName: room?.name ?? 'a room',
            role: result.invitation.role,
            inviterName: user.displayName,
            link: invitationLink(appBaseUrl(req, config), result.token),
            expiresAt: result.invitation.expiresAt,
          }),
        );
      } catch (err) {
        // The invitation is kept; inviting the address again sends a new link.
        mailSent = false;
        (req.log ?? logger).warn(
          { err, invitationId: result.invitation.id },
          'the invitation could not be mailed',
        );
      }
      res.status(202).json({ invited: true, ...result.invitation, mailSent });
    }
  });

  r.patch('/rooms/:id/members/:userId', async (req, res) => {
    const { roomId } = await requireRoomRole(knex, req.params.id, signedInUser(req).id, ['owner']);
    const userId = memberId(req.params.userId);
    const body = check(roleBody, req.body);
    const member = await changeRole(knex, { roomId, userId, role: body.role });
    events.roleChanged(roomId, userId, member.role);
    res.json(member);
  });

  r.delete('/rooms/:id/members/:userId', async (req, res) => {
    const user = signedInUser(req);
    const userId = memberId(req.params.userId);
    // An owner may remove anyone; any member may remove themself (leave).
    const { roomId } = await requireRoomRole(
      knex,
      req.params.id,
      user.id,
      userId === user.id ? undefined : ['owner'],
    );
    await removeMember(knex, { roomId, userId });
    events.roleChanged(roomId, userId, null);
    res.status(204).end();
  });

  return r;
}
