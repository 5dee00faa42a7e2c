/**
 * The lineage of a room: the tree of rooms joined by branches (a room's `parent_snapshot_id` names the
 * snapshot it was started from). Walk up to the root room, then down to every branch of every room in
 * the tree. Rooms the caller belongs to come with their name, role and snapshots; the others only as
 * "a branch you are not in" (id and parent link, so the tree still joins up).
 */
import type { Knex } from 'knex';
import { isRole } from '../rooms/membership';
import { listSnapshots } from './snapshots';
import type { Lineage, LineageRoom } from '../../shared/api/lineage';

/** A deeper tree than this is cut (it cannot arise from the API, but the walk must end). */
const MAX_ROOMS = 2000;

interface RoomLink {
  id: string;
  parentSnapshotId: string | null;
  /** The parent snapshot's room (null when that snapshot or its room is gone). */
  parentRoomId: string | null;
  createdAt: number;
}

async function roomLink(knex: Knex, roomId: string): Promise<RoomLink | null> {
  const row = await knex('rooms as r')
    .leftJoin('snapshots as s', 's.id', 'r.parent_snapshot_id')
    .where('r.id', roomId)
    .first('r.id', 'r.parent_snapshot_id', 's.room_id as parent_room_id', 'r.created_at');
  return row
    ? {
        id: row.id,
        parentSnapshotId: row.parent_snapshot_id ?? null,
        parentRoomId: row.parent_room_id ?? null,
        createdAt: Number(row.created_at),
      }
    : null;
}

async function branchesOf(knex: Knex, roomIds: string[]): Promise<RoomLink[]> {
  if (roomIds.length === 0) return [];
  const rows = await knex('rooms as r')
    .join('snapshots as s', 's.id', 'r.parent_snapshot_id')
    .whereIn('s.room_id', roomIds)
    .select('r.id', 'r.parent_snapshot_id', 's.room_id as parent_room_id', 'r.created_at');
  return rows.map((row) => ({
    id: row.id,
    parentSnapshotId: row.parent_snapshot_id,
    parentRoomId: row.parent_room_id,
    createdAt: Number(row.created_at),
  }));
}

/** The lineage tree of `roomId` as `userId` may see it (the caller has checked membership). */
export async function roomLineage(knex: Knex, roomId: string, userId: string): Promise<Lineage> {
  // Up: follow parent links to the root (a room whose parent snapshot is gone is a root too).
  let root = await roomLink(knex, roomId);
  if (!root) throw new Error(`room ${roomId} does not exist`);
  const seen = new Set([root.id]);
  while (root.parentRoomId && !seen.has(root.parentRoomId) && seen.size < MAX_ROOMS) {
    const up = await roomLink(knex, root.parentRoomId);
    if (!up) break;
    seen.add(up.id);
    root = up;
  }

  // Down: every branch of every room in the tree, breadth first.
  const tree = new Map<string, RoomLink>([[root.id, root]]);
  let frontier = [root.id];
  while (frontier.length > 0 && tree.size < MAX_ROOMS) {
    const next: string[] = [];
    for (const b of await branchesOf(knex, frontier)) {
      if (tree.has(b.id)) continue;
      tree.set(b.id, b);
      next.push(b.id);
    }
    frontier = next;
  }

  const ids = [...tree.keys()];
  const memberships = await knex('room_members as m')
    .join('rooms as r', 'r.id', 'm.room_id')
    .where('m.user_id', userId)
    .whereIn('m.room_id', ids)
    .select('m.room_id', 'm.role', 'r.name');
  const mine = new Map(memberships.map((m) => [m.room_id as string, m]));

  // The root first (even if clocks disagree), then oldest first.
  const rootId = root.id;
  const rank = (l: RoomLink) => (l.id === rootId ? 0 : 1);
  const links = [...tree.values()].sort(
    (a, b) => rank(a) - rank(b) || a.createdAt - b.createdAt || (a.id < b.id ? -1 : 1),
  );
  const rooms: LineageRoom[] = [];
  for (const link of links) {
    const parent = link.parentSnapshotId
      ? { snapshotId: link.parentSnapshotId, roomId: link.parentRoomId }
      : null;
    const m = mine.get(link.id);
    if (!m || !isRole(m.role)) {
      rooms.push({ id: link.id, member: false, parent });
      continue;
    }
    rooms.push({
      id: link.id,
      member: true,
      name: m.name,
      role: m.role,
      createdAt: link.createdAt,
      parent,
      snapshots: await listSnapshots(knex, link.id),
    });
  }
  return { roomId, rootRoomId: rootId, rooms };
}
