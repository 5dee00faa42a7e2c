import { z } from 'zod';

/** The signed-in user, as `GET /api/me` describes them. */
export const userSchema = z.object({
  id: z.string(),
  email: z.string(),
  displayName: z.string(),
});

export type User = z.infer<typeof userSchema>;
