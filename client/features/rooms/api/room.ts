import { z } from 'zod';
import { roomRoleSchema } from '../../../lib/room-role';

/** A time from the server: epoch milliseconds or an ISO string. */
const timeSchema = z.union([z.number(), z.string()]);

/** Where a branch came from: the snapshot it was started from and that snapshot's room. */
export const roomParentSchema = z.looseObject({
  snapshotId: z.string(),
  snapshotLabel: z.string().nullish(),
  /** Absent when the parent room is gone or the user is not one of its members. */
  roomId: z.string().nullish(),
  roomName: z.string().nullish(),
});

/** One entry of `GET /api/rooms` (and the head of `GET /api/rooms/:id`): the contract's `id`, `name`, `role`, plus what the server adds. */
export const roomSummarySchema = z.looseObject({
  id: z.string(),
  name: z.string(),
  role: roomRoleSchema,
  updatedAt: timeSchema.optional(),
  createdAt: timeSchema.optional(),
  parent: roomParentSchema.nullish(),
});

export type RoomSummary = z.infer<typeof roomSummarySchema>;
export type RoomParent = z.infer<typeof roomParentSchema>;
