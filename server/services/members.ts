/**
 * Room membership changes: add a user, invite an address that has no account yet, change a role,
 * remove a member. A room always keeps at least one owner.
 */
import type { Knex } from 'knex';
import type { Role } from '../auth/tokens';
import { conflict, notFound } from '../errors';
import { newId } from '../ids';
import { newInvitationToken } from './invitations';
import { getRole } from '../rooms/membership';
import { findUserByEmail } from './users';
import type { MemberView } from './rooms';
import { listMembers } from './rooms';

/** An invitation link works for 7 days (and once). */
export const INVITATION_TTL_MS = 7 * 24 * 60 * 60 * 1000;

export type AddMemberResult =
  | { kind: 'added'; member: MemberView }
  | {
      kind: 'invited';
      invitation: { id: string; email: string; role: Role; expiresAt: number };
      /** The secret of the invitation link (only its hash is stored): mail it, never log it. */
      token: string;
    };

const lastOwner = () =>
  conflict('last-owner', 'A room needs at least one owner: make someone else an owner first.');
const memberNotFound = () => notFound('That user is not a member of this room.');

/**
 * Add the account with this e-mail address, or, when there is none, store an invitation for it and
 * return the secret token of its link (the caller mails it). Inviting the same address again replaces
 * the earlier pending invitation, whose link then stops working.
 */
export async function addMember(
  knex: Knex,
  input: { roomId: string; email: string; role: Role; invitedBy: string },
): Promise<AddMemberResult> {
  return knex.transaction(async (trx) => {
    const user = await findUserByEmail(trx, input.email);
    const now = Date.now();
    if (!user) {
      // One pending invitation per room and address: a repeated invitation replaces the earlier one.
      await trx('invitations')
        .where({ room_id: input.roomId, email: input.email })
        .whereNull('used_at')
        .delete();
      const invitation = {
        id: newId(),
        email: input.email,
        role: input.role,
        expiresAt: now + INVITATION_TTL_MS,
      };
      const { token, tokenHash } = newInvitationToken();
      await trx('invitations').insert({
        id: invitation.id,
        room_id: input.roomId,
        email: input.email,
        role: input.role,
        invited_by: input.invitedBy,
        token_hash: tokenHash,
        expires_at: invitation.expiresAt,
        created_at: now,
      });
      return { kind: 'invited', invitation, token };
    }
    if (await getRole(trx, input.roomId, user.id))
      throw conflict('already-member', 'That user is already a member of this room.');
    await trx('room_members').insert({
      room_id: input.roomId,
      user_id: user.id,
      role: input.role,
      created_at: now,
    });
    await trx('rooms').where({ id: input.roomId }).update({ updated_at: now });
    const member = (await listMembers(trx, input.roomId)).find((m) => m.userId === user.id)!;
    return { kind: 'added', member };
  });
}

async function ownerCount(trx: Knex.Transaction, roomId: string): Promise<number> {
  const row = await trx('room_members').where({ room_id: roomId, role: 'owner' }).count({ n: '*' }).first();
  return Number(row?.n ?? 0);
}

/** Change a member's role; demoting the last owner is a 409. Returns the updated member. */
export async function changeRole(
  knex: Knex,
  input: { roomId: string; userId: string; role: Role },
): Promise<MemberView> {
  return knex.transaction(async (trx) => {
    const current = await getRole(trx, input.roomId, input.userId);
    if (!current) throw memberNotFound();
    if (current === 'owner' && input.role !== 'owner' && (await ownerCount(trx, input.roomId)) <= 1)
      throw lastOwner();
    await trx('room_members')
      .where({ room_id: input.roomId, user_id: input.userId })
      .update({ role: input.role });
    return (await listMembers(trx, input.roomId)).find((m) => m.userId === input.userId)!;
  });
}

/** Remove a member (or let one leave); the last owner cannot go. */
export async function removeMember(knex: Knex, input: { roomId: string; userId: string }): Promise<void> {
  await knex.transaction(async (trx) => {
    const current = await getRole(trx, input.roomId, input.userId);
    if (!current) throw memberNotFound();
    if (current === 'owner' && (await ownerCount(trx, input.roomId)) <= 1) throw lastOwner();
    await trx('room_members').where({ room_id: input.roomId, user_id: input.userId }).delete();
  });
}

export interface InvitationView {
  id: string;
  email: string;
  role: Role;
  expiresAt: number;
  createdAt: number;
}

/** Pending (unused, unexpired) invitations of a room. */
export async function listInvitations(
  knex: Knex | Knex.Transaction,
  roomId: string,
): Promise<InvitationView[]> {
  const rows = await knex('invitations')
    .where({ room_id: roomId })
    .whereNull('used_at')
    .andWhere('expires_at', '>', Date.now())
    .orderBy('created_at', 'desc')
    .select('id', 'email', 'role', 'expires_at', 'created_at');
  return rows.map((r) => ({
    id: r.id,
    email: r.email,
    role: r.role,
    expiresAt: Number(r.expires_at),
    createdAt: Number(r.created_at),
  }));
}
