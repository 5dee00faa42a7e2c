import { z } from 'zod';

/** The three roles of a room (PRODUCT.md "Who is in a room"); the server enforces them. */
export const roomRoles = ['owner', 'tuner', 'observer'] as const;
export const roomRoleSchema = z.enum(roomRoles);
export type RoomRole = z.infer<typeof roomRoleSchema>;

export const roleDescriptions: Record<RoomRole, string> = {
  owner: 'Everything: edit, snapshot, branch, invite, change roles, delete the room',
  tuner: 'Edits the chain, load, band and goal; snapshots; branches',
  observer: 'Watches live, follows a tuner, leaves review notes; never changes the design',
};
