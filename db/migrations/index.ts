import type { Knex } from 'knex';
import * as initial from './20261201_0001_initial';

/**
 * The migrations, listed in order. A static list (rather than a folder scan) works the same under tsx,
 * Vitest and any bundler; add each new migration file here.
 */
const migrations: Record<string, Knex.Migration> = {
  '20261201_0001_initial': initial,
};

export const migrationSource: Knex.MigrationSource<string> = {
  getMigrations: async () => Object.keys(migrations),
  getMigrationName: (name) => name,
  getMigration: async (name) => migrations[name],
};
