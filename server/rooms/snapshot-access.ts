/**
 * Access to a snapshot goes through its room: a caller who is not a member of the snapshot's room (or a
 * snapshot that does not exist, or a malformed id) gets 404 "Snapshot not found."; a member whose role
 * is not enough, 403.
 */
import type { Knex } from 'knex';
import type { Role } from '../auth/tokens';
import { notFound } from '../errors';
import { idParam } from '../validate';
import { snapshotRoomId } from '../services/snapshots';
import { requireRoomRole } from './access';

export const snapshotNotFound = () => notFound('Snapshot not found.');

export async function requireSnapshotRole(
  knex: Knex,
  snapshotId: unknown,
  userId: string,
  allowed?: readonly Role[],
): Promise<{ snapshotId: string; roomId: string; role: Role }> {
  const id = idParam.safeParse(snapshotId);
  const roomId = id.success ? await snapshotRoomId(knex, id.data) : null;
  if (!id.success || !roomId) throw snapshotNotFound();
  try {
    return { snapshotId: id.data, ...(await requireRoomRole(knex, roomId, userId, allowed)) };
  } catch (e) {
    if ((e as { status?: number }).status === 404) throw snapshotNotFound();
    throw e;
  }
}
