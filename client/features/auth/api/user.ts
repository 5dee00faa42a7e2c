import { z } from 'zod';

/** The signed-in user, as `GET /api/me` describes them. */
export const userSchema = z.object({
  id: z.string(),
  email: z.string(),
  displayName: z.string(),
  /** `GET /api/me` says whether review requests are mailed to this account (absent from sign-in answers). */
  notifyReviews: z.boolean().optional(),
});

export type User = z.infer<typeof userSchema>;
