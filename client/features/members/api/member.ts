import { z } from 'zod';
import { roomRoleSchema } from '../../../lib/room-role';

const timeSchema = z.union([z.number(), z.string()]);

/** A member of a room: who they are and their role there. */
export const memberSchema = z.looseObject({
  userId: z.string(),
  email: z.string(),
  displayName: z.string(),
  role: roomRoleSchema,
  joinedAt: timeSchema.optional(),
});

/** An address invited by e-mail that has no account yet. */
export const invitationSchema = z.looseObject({
  id: z.string(),
  email: z.string(),
  role: roomRoleSchema,
  expiresAt: timeSchema.optional(),
  createdAt: timeSchema.optional(),
  /** Only in the answer to an invitation just made: false when the mail server refused the message. */
  mailSent: z.boolean().optional(),
});

export type Member = z.infer<typeof memberSchema>;
export type Invitation = z.infer<typeof invitationSchema>;
