/** Pieces shared by the API schemas: ids, roles, people, the error body. */
import { z } from 'zod';

export const apiIdSchema = z
  .string({ error: 'must be a string' })
  .min(1, 'must not be empty')
  .max(64, 'must be at most 64 characters')
  .regex(/^[A-Za-z0-9_-]+$/, 'is not a valid id');

export const apiRoleSchema = z.enum(['owner', 'tuner', 'observer'], {
  error: 'must be "owner", "tuner" or "observer"',
});
export type ApiRole = z.infer<typeof apiRoleSchema>;

/** Who did something; null when the account is gone. */
export const personSchema = z.object({ id: z.string(), displayName: z.string() });
export type Person = z.infer<typeof personSchema>;

/** Every 4xx body: `{ error: { code, message, ...extra } }`. */
export const apiErrorBodySchema = z.object({
  error: z.looseObject({ code: z.string(), message: z.string() }),
});
export type ApiErrorBody = z.infer<typeof apiErrorBodySchema>;

/** A JSON body must be an object. */
export function jsonBody<T extends z.ZodRawShape>(shape: T) {
  return z.strictObject(shape, {
    error: 'the request body must be a JSON object (Content-Type: application/json)',
  });
}
