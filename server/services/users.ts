/** Accounts: the users table. E-mail addresses are stored trimmed and lower-cased. */
import type { Knex } from 'knex';
import { conflict } from '../errors';
import { newId } from '../ids';

export interface PublicUser {
  id: string;
  email: string;
  displayName: string;
}

interface UserRow {
  id: string;
  email: string;
  display_name: string;
  password_hash: string;
}

const toPublic = (r: UserRow): PublicUser => ({ id: r.id, email: r.email, displayName: r.display_name });

export function normalizeEmail(email: string): string {
  return email.trim().toLowerCase();
}

export async function findUserById(knex: Knex | Knex.Transaction, id: string): Promise<PublicUser | null> {
  const row = (await knex('users').where({ id }).first()) as UserRow | undefined;
  return row ? toPublic(row) : null;
}

/** The account and its password hash (for sign-in only). */
export async function findUserCredentials(
  knex: Knex | Knex.Transaction,
  email: string,
): Promise<{ user: PublicUser; passwordHash: string } | null> {
  const row = (await knex('users')
    .where({ email: normalizeEmail(email) })
    .first()) as UserRow | undefined;
  return row ? { user: toPublic(row), passwordHash: row.password_hash } : null;
}

export async function findUserByEmail(
  knex: Knex | Knex.Transaction,
  email: string,
): Promise<PublicUser | null> {
  return (await findUserCredentials(knex, email))?.user ?? null;
}

function isUniqueViolation(e: unknown): boolean {
  const code = (e as { code?: string } | null)?.code;
  return code === 'SQLITE_CONSTRAINT_UNIQUE' || code === 'SQLITE_CONSTRAINT_PRIMARYKEY' || code === '23505';
}

export const EMAIL_TAKEN_MESSAGE =
  'That e-mail address cannot be used to sign up. Sign in instead if it is yours.';

/** Create an account; a second account for the same address is a 409 `email-taken`. */
export async function createUser(
  knex: Knex | Knex.Transaction,
  input: { email: string; displayName: string; passwordHash: string },
): Promise<PublicUser> {
  const row: UserRow & { created_at: number } = {
    id: newId(),
    email: normalizeEmail(input.email),
    display_name: input.displayName,
    password_hash: input.passwordHash,
    created_at: Date.now(),
  };
  try {
    await knex('users').insert(row);
  } catch (e) {
    if (isUniqueViolation(e)) throw conflict('email-taken', EMAIL_TAKEN_MESSAGE);
    throw e;
  }
  return toPublic(row);
}

/** The account with its settings (for `GET/PATCH /api/me`). */
export async function getAccount(
  knex: Knex | Knex.Transaction,
  id: string,
): Promise<(PublicUser & { notifyReviews: boolean }) | null> {
  const row = (await knex('users').where({ id }).first()) as
    (UserRow & { notify_reviews: number | boolean }) | undefined;
  return row ? { ...toPublic(row), notifyReviews: Boolean(row.notify_reviews) } : null;
}

export async function updateAccount(
  knex: Knex | Knex.Transaction,
  id: string,
  change: { notifyReviews?: boolean },
): Promise<void> {
  if (change.notifyReviews !== undefined)
    await knex('users').where({ id }).update({ notify_reviews: change.notifyReviews });
}
