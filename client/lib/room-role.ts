import { z } from 'zod';

/** The three roles of a room (PRODUCT.md "Who is in a room"); the server enforces them. */
export const roomRoles = ['owner', 'tuner', 'observer'] as const;
export const roomRoleSchema = z.enum(roomRoles);
export type RoomRole = z.infer<typeof roomRoleSchema>;

/** "Owner", "Tuner", "Observer": the role as a word in a sentence or a menu. */
export const roleLabel = (role: RoomRole): string => role[0].toUpperCase() + role.slice(1);

/** "an observer", "a tuner". */
export const roleWithArticle = (role: RoomRole): string => `${role === 'owner' || role === 'observer' ? 'an' : 'a'} ${role}`;

export const roleDescriptions: Record<RoomRole, string> = {
  owner: 'Everything: edit, snapshot, branch, invite, change roles, delete the room',
  tuner: 'Edits the chain, load, band and goal; snapshots; branches',
  observer: 'Watches live, follows a tuner, leaves review notes; never changes the design',
};
