/**
 * The database: Knex over better-sqlite3. Every pooled connection gets WAL mode, foreign keys and a busy
 * timeout. Migrations come from the static list in db/migrations/index.ts.
 */
import { mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import knexFactory, { type Knex } from 'knex';
import { migrationSource } from '../db/migrations/index';

export const BUSY_TIMEOUT_MS = 5000;

interface SqliteConnection {
  pragma(source: string): unknown;
}

/** Knex settings for a SQLite file (shared by the server, the CLIs and knexfile.ts). */
export function databaseSettings(databaseFile: string): Knex.Config {
  const filename = databaseFile === ':memory:' ? ':memory:' : resolve(databaseFile);
  return {
    client: 'better-sqlite3',
    connection: { filename },
    useNullAsDefault: true,
    pool: {
      afterCreate(conn: SqliteConnection, done: (err: Error | null, conn: SqliteConnection) => void) {
        try {
          conn.pragma('journal_mode = WAL');
          conn.pragma('foreign_keys = ON');
          conn.pragma(`busy_timeout = ${BUSY_TIMEOUT_MS}`);
          conn.pragma('synchronous = NORMAL');
          done(null, conn);
        } catch (e) {
          done(e as Error, conn);
        }
      },
    },
    migrations: { migrationSource },
  };
}

/** Open the database file, creating its folder first. */
export function createKnex(databaseFile: string): Knex {
  if (databaseFile !== ':memory:') mkdirSync(dirname(resolve(databaseFile)), { recursive: true });
  return knexFactory(databaseSettings(databaseFile));
}

/** Apply every pending migration; returns the names applied now. */
export async function migrateLatest(knex: Knex): Promise<string[]> {
  const [, applied] = (await knex.migrate.latest({ migrationSource })) as [number, string[]];
  return applied;
}
