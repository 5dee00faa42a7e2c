import type { Knex } from 'knex';

/**
 * PostgreSQL only (a no-op on SQLite, whose behaviour stays as it was): the two SQLite features the
 * services' queries lean on.
 * - `rowid`: notes, uploads and snapshots order ties by insertion (`n.rowid`). PostgreSQL has no rowid, so
 *   those tables get a `rowid bigserial` column, filled in physical order for existing rows and counting up
 *   for new ones.
 * - scalar `MAX(a, b)` of two bigints (rooms' last change): PostgreSQL spells it GREATEST, so a two-argument
 *   `max(bigint, bigint)` function is defined (the one-argument aggregate is untouched).
 */
const ROWID_TABLES = ['notes', 'uploads', 'snapshots'] as const;

function isPostgres(knex: Knex): boolean {
  return (knex.client as { config?: { client?: unknown } }).config?.client === 'pg';
}

export async function up(knex: Knex): Promise<void> {
  if (!isPostgres(knex)) return;
  for (const table of ROWID_TABLES) await knex.raw('alter table ?? add column rowid bigserial', [table]);
  await knex.raw(
    'create or replace function max(a bigint, b bigint) returns bigint language sql immutable as $$ select greatest(a, b) $$',
  );
}

export async function down(knex: Knex): Promise<void> {
  if (!isPostgres(knex)) return;
  await knex.raw('drop function if exists max(bigint, bigint)');
  for (const table of ROWID_TABLES) await knex.raw('alter table ?? drop column if exists rowid', [table]);
}
