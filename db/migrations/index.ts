import type { Knex } from 'knex';
import * as initial from './20261201_0001_initial';
import * as team from './20261215_0002_team';
import * as postgresCompat from './20261220_0003_postgres_compat';

/**
 * The migrations, listed in order. A static list (rather than a folder scan) works the same under tsx,
 * Vitest and any bundler; add each new migration file here.
 */
const migrations: Record<string, Knex.Migration> = {
  '20261201_0001_initial': initial,
  '20261215_0002_team': team,
  '20261220_0003_postgres_compat': postgresCompat,
};

export const migrationSource: Knex.MigrationSource<string> = {
  getMigrations: async () => Object.keys(migrations),
  getMigrationName: (name) => name,
  getMigration: async (name) => migrations[name],
};
