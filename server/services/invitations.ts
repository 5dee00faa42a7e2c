/**
 * Invitation links: `${publicUrl}/invitations/<token>`, where the token is 32 random bytes (base64url)
 * and only its SHA-256 hash is stored, so a database copy cannot be turned into working links. A link
 * works until `expires_at` and once (`used_at`), and only for an account with the invited address.
 */
import { createHash, randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import type { Role } from '../auth/tokens';
import { HttpError } from '../errors';
import { getRole, isRole } from '../rooms/membership';
import { formatUtc } from '../mail/messages';
import type { PublicUser } from './users';
import type { InvitationPreview, InvitationState } from '../../shared/api/invitations';

const TOKEN_FORMAT = /^[A-Za-z0-9_-]{43}$/;

export function hashInvitationToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export function newInvitationToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, tokenHash: hashInvitationToken(token) };
}

interface InvitationRecord {
  id: string;
  roomId: string;
  roomName: string;
  email: string;
  role: Role;
  inviterName: string | null;
  expiresAt: number;
  usedAt: number | null;
}

export const invitationNotFound = () =>
  new HttpError(
    404,
    'invitation-not-found',
    'This invitation link is not valid: it may have been replaced by a newer invitation, or the room was deleted. Ask the room’s owner to invite you again.',
  );

async function findInvitation(
  knex: Knex | Knex.Transaction,
  token: unknown,
): Promise<InvitationRecord | null> {
  if (typeof token !== 'string' || !TOKEN_FORMAT.test(token)) return null;
  const row = await knex('invitations as i')
    .join('rooms as r', 'r.id', 'i.room_id')
    .leftJoin('users as u', 'u.id', 'i.invited_by')
    .where('i.token_hash', hashInvitationToken(token))
    .first(
      'i.id',
      'i.room_id',
      'r.name as room_name',
      'i.email',
      'i.role',
      'u.display_name',
      'i.expires_at',
      'i.used_at',
    );
  if (!row || !isRole(row.role)) return null;
  return {
    id: row.id,
    roomId: row.room_id,
    roomName: row.room_name,
    email: row.email,
    role: row.role,
    inviterName: row.display_name ?? null,
    expiresAt: Number(row.expires_at),
    usedAt: row.used_at === null || row.used_at === undefined ? null : Number(row.used_at),
  };
}

function stateOf(r: InvitationRecord, now: number): InvitationState {
  if (r.usedAt !== null) return 'used';
  return r.expiresAt <= now ? 'expired' : 'pending';
}

/** What the link shows before it is accepted; 404 for a token that names no invitation. */
export async function previewInvitation(knex: Knex, token: unknown): Promise<InvitationPreview> {
  const r = await findInvitation(knex, token);
  if (!r) throw invitationNotFound();
  return {
    roomName: r.roomName,
    role: r.role,
    email: r.email,
    invitedBy: r.inviterName ? { displayName: r.inviterName } : null,
    expiresAt: r.expiresAt,
    state: stateOf(r, Date.now()),
  };
}

const used = () =>
  new HttpError(
    410,
    'invitation-used',
    'This invitation link has already been used. Each link works once; ask the room’s owner for a new invitation if you need one.',
  );

/**
 * Join the room with the invitation's role, once. The signed-in account's address must be the invited
 * one. An account that is already a member keeps its role (the invitation is used up all the same).
 */
export async function acceptInvitation(
  knex: Knex,
  token: unknown,
  user: PublicUser,
): Promise<{ roomId: string; role: Role; alreadyMember: boolean }> {
  return knex.transaction(async (trx) => {
    const r = await findInvitation(trx, token);
    if (!r) throw invitationNotFound();
    const now = Date.now();
    const state = stateOf(r, now);
    if (state === 'used') throw used();
    if (state === 'expired')
      throw new HttpError(
        410,
        'invitation-expired',
        `This invitation link expired on ${formatUtc(r.expiresAt)}. Ask the room’s owner to invite you again.`,
      );
    if (r.email !== user.email.toLowerCase())
      throw new HttpError(
        403,
        'wrong-account',
        `This invitation is for ${r.email}, but you are signed in as ${user.email}. Sign in with the invited address to accept it.`,
      );
    const taken = await trx('invitations')
      .where({ id: r.id })
      .whereNull('used_at')
      .update({ used_at: now, user_id: user.id });
    if (taken !== 1) throw used();
    const existing = await getRole(trx, r.roomId, user.id);
    if (existing) return { roomId: r.roomId, role: existing, alreadyMember: true };
    await trx('room_members').insert({ room_id: r.roomId, user_id: user.id, role: r.role, created_at: now });
    await trx('rooms').where({ id: r.roomId }).update({ updated_at: now });
    return { roomId: r.roomId, role: r.role, alreadyMember: false };
  });
}
