/** Who belongs to a room, and as what. The single place that reads a member's role. */
import type { Knex } from 'knex';
import { ROLES, type Role } from '../auth/tokens';

export function isRole(v: unknown): v is Role {
  return typeof v === 'string' && (ROLES as readonly string[]).includes(v);
}

/** The user's role in the room, or null when the user is not a member (or the room does not exist). */
export async function getRole(
  knex: Knex | Knex.Transaction,
  roomId: string,
  userId: string,
): Promise<Role | null> {
  const row = await knex('room_members').where({ room_id: roomId, user_id: userId }).first('role');
  return row && isRole(row.role) ? row.role : null;
}

/** Roles allowed to change the design, take snapshots and branch. */
export const EDITOR_ROLES: readonly Role[] = ['owner', 'tuner'];
export function canEdit(role: Role | null): boolean {
  return role !== null && EDITOR_ROLES.includes(role);
}
