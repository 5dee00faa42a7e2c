/**
 * Password hashes (bcryptjs). bcrypt reads at most 72 bytes, so longer passwords are refused rather than
 * silently cut. `verifyOrDummy` compares against a fixed dummy hash when there is no account, so an unknown
 * e-mail address takes as long to refuse as a wrong password.
 */
import bcrypt from 'bcryptjs';
import { randomBytes } from 'node:crypto';

export const PASSWORD_MIN_CHARS = 10;
export const PASSWORD_MAX_BYTES = 72;
export const DEFAULT_BCRYPT_COST = 10;

export interface PasswordHasher {
  hash(password: string): Promise<string>;
  /** true only when `hash` is given and matches; with no hash, spends the same time and returns false. */
  verifyOrDummy(password: string, hash: string | null | undefined): Promise<boolean>;
}

export function createPasswordHasher(cost = DEFAULT_BCRYPT_COST): PasswordHasher {
  let dummy: Promise<string> | undefined;
  const dummyHash = () => (dummy ??= bcrypt.hash(randomBytes(18).toString('base64'), cost));
  return {
    hash: (password) => bcrypt.hash(password, cost),
    async verifyOrDummy(password, hash) {
      if (!hash) {
        await bcrypt.compare(password, await dummyHash());
        return false;
      }
      return bcrypt.compare(password, hash);
    },
  };
}
