import { randomBytes } from 'node:crypto';

/** An unguessable id: 16 random bytes (128 bits) as base64url, 22 characters. */
export function newId(bytes = 16): string {
  return randomBytes(Math.max(16, bytes)).toString('base64url');
}
