import { z } from 'zod';
import { roomRoleSchema } from '../../../lib/room-role';

/** A member of a room: who they are and their role there. */
export const memberSchema = z
  .looseObject({
    userId: z.string().optional(),
    id: z.string().optional(),
    email: z.string(),
    displayName: z.string().optional(),
    role: roomRoleSchema,
  })
  .transform(({ userId, id, ...rest }) => ({ ...rest, userId: userId ?? id ?? '' }))
  .refine((m) => m.userId !== '', 'a member needs an id');

/** An address invited by e-mail that has no account yet. */
export const invitationSchema = z.looseObject({
  email: z.string(),
  role: roomRoleSchema,
  expiresAt: z.union([z.number(), z.string()]).optional(),
});

export type Member = z.infer<typeof memberSchema>;
export type Invitation = z.infer<typeof invitationSchema>;
