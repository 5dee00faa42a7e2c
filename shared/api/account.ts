/** `GET/PATCH /api/me`: the signed-in account and its settings. */
import { z } from 'zod';
import { jsonBody } from './common';

export const accountSchema = z.object({
  id: z.string(),
  email: z.string(),
  displayName: z.string(),
  /** E-mail me when a snapshot in one of my rooms is marked for review. */
  notifyReviews: z.boolean(),
});
export type Account = z.infer<typeof accountSchema>;

export const accountPatchBodySchema = jsonBody({
  notifyReviews: z.boolean({ error: 'must be true or false' }).optional(),
});
export type AccountPatchBody = z.infer<typeof accountPatchBodySchema>;
