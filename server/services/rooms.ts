/**
 * Rooms: create (with the room document, in one transaction), list, details, rename, delete. Every
 * function takes Knex (or a transaction) as its first argument; nothing here reads the request.
 */
import type { Knex } from 'knex';
import type { Role } from '../auth/tokens';
import { createRoomDocument } from '../collab/store';
import { newId } from '../ids';
import { isRole } from '../rooms/membership';
import type { Design, DesignInput } from '../../shared/rf/design';

export interface RoomParent {
  snapshotId: string;
  snapshotLabel: string | null;
  /** roomId and roomName are null when the parent room is gone or the caller is not a member of it. */
  roomId: string | null;
  roomName: string | null;
}

export interface RoomSummary {
  id: string;
  name: string;
  role: Role;
  createdAt: number;
  updatedAt: number;
  parent: RoomParent | null;
}

export interface MemberView {
  userId: string;
  email: string;
  displayName: string;
  role: Role;
  joinedAt: number;
}

export interface RoomDetails extends RoomSummary {
  createdBy: string | null;
  members: MemberView[];
}

interface RoomRow {
  id: string;
  name: string;
  role: string;
  created_at: number;
  updated_at: number;
  created_by: string | null;
  parent_snapshot_id: string | null;
  parent_label: string | null;
  parent_room_id: string | null;
  parent_room_name: string | null;
  parent_member: string | null;
  last_change: number | null;
}

/** rooms joined with the caller's membership, the parent snapshot and the newest stored change. */
function roomQuery(knex: Knex | Knex.Transaction, userId: string) {
  return knex('rooms as r')
    .join('room_members as m', function () {
      this.on('m.room_id', '=', 'r.id').andOn('m.user_id', '=', knex.raw('?', [userId]));
    })
    .leftJoin('snapshots as s', 's.id', 'r.parent_snapshot_id')
    .leftJoin('rooms as pr', 'pr.id', 's.room_id')
    .leftJoin('room_members as pm', function () {
      this.on('pm.room_id', '=', 'pr.id').andOn('pm.user_id', '=', knex.raw('?', [userId]));
    })
    .select(
      'r.id',
      'r.name',
      'm.role',
      'r.created_at',
      'r.updated_at',
      'r.created_by',
      'r.parent_snapshot_id',
      's.label as parent_label',
      's.room_id as parent_room_id',
      'pm.user_id as parent_member',
      'pr.name as parent_room_name',
      knex.raw(
        `MAX(COALESCE((SELECT MAX(u.created_at) FROM room_updates u WHERE u.room_id = r.id), 0),
             COALESCE((SELECT st.updated_at FROM room_states st WHERE st.room_id = r.id), 0)) as last_change`,
      ),
    );
}

function toSummary(r: RoomRow): RoomSummary {
  return {
    id: r.id,
    name: r.name,
    role: isRole(r.role) ? r.role : 'observer',
    createdAt: Number(r.created_at),
    updatedAt: Math.max(Number(r.updated_at), Number(r.last_change ?? 0)),
    parent: r.parent_snapshot_id
      ? {
          snapshotId: r.parent_snapshot_id,
          snapshotLabel: r.parent_label ?? null,
          roomId: r.parent_member ? r.parent_room_id : null,
          roomName: r.parent_member ? r.parent_room_name : null,
        }
      : null,
  };
}

/** The rooms the user belongs to, most recently changed first. */
export async function listRooms(knex: Knex | Knex.Transaction, userId: string): Promise<RoomSummary[]> {
  const rows = (await roomQuery(knex, userId)) as RoomRow[];
  return rows.map(toSummary).sort((a, b) => b.updatedAt - a.updatedAt || a.name.localeCompare(b.name));
}

export async function listMembers(knex: Knex | Knex.Transaction, roomId: string): Promise<MemberView[]> {
  const rows = await knex('room_members as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where('m.room_id', roomId)
    .orderBy([
      { column: 'm.created_at', order: 'asc' },
      { column: 'u.email', order: 'asc' },
    ])
    .select('m.user_id', 'u.email', 'u.display_name', 'm.role', 'm.created_at');
  return rows.map((r) => ({
    userId: r.user_id,
    email: r.email,
    displayName: r.display_name,
    role: isRole(r.role) ? r.role : 'observer',
    joinedAt: Number(r.created_at),
  }));
}

/** One room as the user sees it (null when the user is not a member). */
export async function getRoomDetails(
  knex: Knex | Knex.Transaction,
  roomId: string,
  userId: string,
): Promise<RoomDetails | null> {
  const row = (await roomQuery(knex, userId).where('r.id', roomId).first()) as RoomRow | undefined;
  if (!row) return null;
  return { ...toSummary(row), createdBy: row.created_by, members: await listMembers(knex, roomId) };
}

export interface NewRoom {
  name: string;
  ownerId: string;
  /** the first design; or, for a branch, `state` (a Yjs update) is copied instead. */
  design: Design | DesignInput;
  state?: Uint8Array;
  parentSnapshotId?: string | null;
  /** other members to add at once (the seed uses this). */
  members?: { userId: string; role: Role }[];
  now?: number;
}

/** Create a room, its owner membership and its document, in one transaction. Returns the new id. */
export async function createRoom(knex: Knex, input: NewRoom): Promise<string> {
  return knex.transaction((trx) => createRoomIn(trx, input));
}

export async function createRoomIn(trx: Knex.Transaction, input: NewRoom): Promise<string> {
  const id = newId();
  const now = input.now ?? Date.now();
  await trx('rooms').insert({
    id,
    name: input.name,
    created_by: input.ownerId,
    parent_snapshot_id: input.parentSnapshotId ?? null,
    created_at: now,
    updated_at: now,
  });
  const members = [
    { userId: input.ownerId, role: 'owner' as Role },
    ...(input.members ?? []).filter((m) => m.userId !== input.ownerId),
  ];
  await trx('room_members').insert(
    members.map((m) => ({ room_id: id, user_id: m.userId, role: m.role, created_at: now })),
  );
  if (input.state)
    await trx('room_states').insert({
      room_id: id,
      state: Buffer.from(input.state),
      upto_id: 0,
      updated_at: now,
    });
  else {
    await createRoomDocument(trx, id, input.design);
    await trx('room_states').where({ room_id: id }).update({ updated_at: now });
  }
  return id;
}

export async function renameRoom(knex: Knex | Knex.Transaction, roomId: string, name: string): Promise<void> {
  await knex('rooms').where({ id: roomId }).update({ name, updated_at: Date.now() });
}

/** Delete a room; members, document, snapshots, notes and uploads go with it (foreign-key cascade). */
export async function deleteRoom(knex: Knex | Knex.Transaction, roomId: string): Promise<void> {
  await knex('rooms').where({ id: roomId }).delete();
}
