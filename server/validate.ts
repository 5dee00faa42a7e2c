/**
 * Request checking at the boundary: bodies and params go through a zod schema; the first problem
 * becomes a 400 `{ error: { code: 'invalid-input', message: '<field>: <reason>', field } }`.
 */
import { z } from 'zod';
import { formatJsonPath } from '../shared/rf/design';
import { badRequest } from './errors';

function valueAt(value: unknown, path: readonly PropertyKey[]): unknown {
  let v = value;
  for (const key of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<PropertyKey, unknown>)[key];
  }
  return v;
}

function describe(issue: z.core.$ZodIssue, input: unknown): string {
  if (issue.path.length > 0 && issue.code !== 'custom' && valueAt(input, issue.path) === undefined)
    return 'is required';
  if (issue.code === 'unrecognized_keys')
    return `has unknown field(s) ${issue.keys.map((k) => JSON.stringify(k)).join(', ')}`;
  return issue.message;
}

/** Parse `value` (a body, params or query) or throw a 400 naming the field. `what` names an unnamed whole. */
export function check<S extends z.ZodType>(schema: S, value: unknown, what = 'body'): z.output<S> {
  const r = schema.safeParse(value);
  if (r.success) return r.data;
  const issue = r.error.issues[0];
  const field = issue.path.length ? formatJsonPath(issue.path as PropertyKey[]) : what;
  return badRequestThrow(field, describe(issue, value));
}

function badRequestThrow(field: string, reason: string): never {
  throw badRequest(`${field}: ${reason}`, { field });
}

/** A JSON body must be an object (express leaves `req.body` undefined for other content types). */
export function bodyObject<T extends z.ZodRawShape>(shape: T) {
  return z.object(shape, {
    error: 'the request body must be a JSON object (Content-Type: application/json)',
  });
}

export const emailSchema = z
  .string({ error: 'must be a string' })
  .trim()
  .toLowerCase()
  .max(320, 'must be at most 320 characters')
  .pipe(z.email({ error: 'must be a valid e-mail address' }));

export const roleSchema = z.enum(['owner', 'tuner', 'observer'], {
  error: 'must be "owner", "tuner" or "observer"',
});

export const idParam = z
  .string()
  .min(1)
  .max(64)
  .regex(/^[A-Za-z0-9_-]+$/, 'is not a valid id');

export const roomNameSchema = z
  .string({ error: 'must be a string' })
  .trim()
  .min(1, 'must not be empty')
  .max(200, 'must be at most 200 characters');
