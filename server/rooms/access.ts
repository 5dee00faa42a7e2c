/**
 * Room access for a request: a non-member (or a room that does not exist) gets 404 and never learns the
 * room exists; a member whose role is not enough gets 403.
 */
import type { Knex } from 'knex';
import type { Role } from '../auth/tokens';
import { forbidden, notFound } from '../errors';
import { idParam } from '../validate';
import { getRole } from './membership';

export const roomNotFound = () => notFound('Room not found.');

/** The caller's role in the room, or a 404/403. `allowed` omitted = any member. */
export async function requireRoomRole(
  knex: Knex | Knex.Transaction,
  roomId: unknown,
  userId: string,
  allowed?: readonly Role[],
): Promise<{ roomId: string; role: Role }> {
  const id = idParam.safeParse(roomId);
  if (!id.success) throw roomNotFound();
  const role = await getRole(knex, id.data, userId);
  if (!role) throw roomNotFound();
  if (allowed && !allowed.includes(role)) throw forbidden();
  return { roomId: id.data, role };
}
