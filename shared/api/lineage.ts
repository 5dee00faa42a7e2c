/**
 * `GET /api/rooms/:id/lineage`: the tree of rooms and snapshots this room belongs to. Rooms are listed
 * root first (oldest first); each names the snapshot it was branched from. A room the caller is not a
 * member of appears only as `{ id, member: false, parent }`: "a branch you are not in".
 */
import { z } from 'zod';
import { apiRoleSchema } from './common';
import { snapshotSchema } from './snapshots';

/** roomId is null when the parent snapshot's room was deleted. */
export const lineageParentSchema = z
  .object({ snapshotId: z.string(), roomId: z.string().nullable() })
  .nullable();

export const lineageMemberRoomSchema = z.object({
  id: z.string(),
  member: z.literal(true),
  name: z.string(),
  role: apiRoleSchema,
  createdAt: z.number(),
  parent: lineageParentSchema,
  /** Newest first, with their headline figures. */
  snapshots: z.array(snapshotSchema),
});
export const lineageHiddenRoomSchema = z.object({
  id: z.string(),
  member: z.literal(false),
  parent: lineageParentSchema,
});
export const lineageRoomSchema = z.discriminatedUnion('member', [
  lineageMemberRoomSchema,
  lineageHiddenRoomSchema,
]);
export type LineageRoom = z.infer<typeof lineageRoomSchema>;

export const lineageSchema = z.object({
  roomId: z.string(),
  rootRoomId: z.string(),
  rooms: z.array(lineageRoomSchema),
});
export type Lineage = z.infer<typeof lineageSchema>;
