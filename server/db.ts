/**
 * The database: Knex over better-sqlite3 (DATABASE_FILE), or over PostgreSQL (`pg`) when DATABASE_URL is
 * set. Every pooled SQLite connection gets WAL mode, foreign keys and a busy timeout, so a write that meets
 * another connection's lock waits (up to BUSY_TIMEOUT_MS) instead of failing. On PostgreSQL, bigint
 * columns (the millisecond times) come back as numbers, as they do from SQLite. Migrations come from the
 * static list in db/migrations/index.ts.
 */
import { mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import knexFactory, { type Knex } from 'knex';
import { createRequire } from 'node:module';
import { migrationSource } from '../db/migrations/index';

export const BUSY_TIMEOUT_MS = 5000;

interface SqliteConnection {
  pragma(source: string): unknown;
}

/**
 * SQLite files whose WAL a thread of the collab writer checkpoints (server/collab/store.ts). Pooled
 * connections to them never checkpoint on commit: SQLite's automatic checkpoint, run by whichever
 * connection commits past 1,000 WAL pages, would fsync on the event loop (30 ms stalls seen with 50
 * busy rooms).
 */
const checkpointedByThread = new Map<string, number>();

/**
 * From now on `filename`'s checkpoints are a thread's: turn off the automatic ones of `knex`'s connections.
 * Returns the undo, which turns them back on once the last writer of that file in this process is gone.
 */
export function checkpointOnThread(knex: Knex, filename: string): () => void {
  checkpointedByThread.set(filename, (checkpointedByThread.get(filename) ?? 0) + 1);
  void knex.raw('PRAGMA wal_autocheckpoint = 0').catch(() => {});
  let undone = false;
  return () => {
    if (undone) return;
    undone = true;
    const left = (checkpointedByThread.get(filename) ?? 1) - 1;
    if (left > 0) {
      checkpointedByThread.set(filename, left);
      return;
    }
    checkpointedByThread.delete(filename);
    void knex.raw('PRAGMA wal_autocheckpoint = 1000').catch(() => {});
  };
}

/** A `postgres://` or `postgresql://` address. */
export function isPostgresUrl(value: string | undefined): value is string {
  return typeof value === 'string' && /^postgres(ql)?:\/\//i.test(value.trim());
}

/** int8 (OID 20) as a JavaScript number: the times stored are milliseconds, far below 2^53. */
const PG_INT8_OID = 20;
let pgTypesSet = false;
function usePgNumbers(): void {
  if (pgTypesSet) return;
  // Loaded only for PostgreSQL (and untyped: the project carries no @types/pg).
  const pg = createRequire(import.meta.url)('pg') as {
    types: { setTypeParser(oid: number, parse: (value: string) => unknown): void };
  };
  pg.types.setTypeParser(PG_INT8_OID, (v: string) => {
    const n = Number(v);
    if (!Number.isSafeInteger(n)) throw new RangeError(`bigint ${v} is past 2^53`);
    return n;
  });
  pgTypesSet = true;
}

/** Knex settings for PostgreSQL at `url`. */
export function postgresSettings(url: string): Knex.Config {
  usePgNumbers();
  return {
    client: 'pg',
    connection: url.trim(),
    pool: { min: 0, max: 10 },
    migrations: { migrationSource },
  };
}

/**
 * Knex settings for the database: PostgreSQL when `databaseUrl` (or `databaseFile` itself) is a
 * postgres:// address, otherwise the SQLite file (shared by the server, the CLIs and knexfile.ts).
 */
export function databaseSettings(databaseFile: string, databaseUrl?: string): Knex.Config {
  if (isPostgresUrl(databaseUrl)) return postgresSettings(databaseUrl);
  if (isPostgresUrl(databaseFile)) return postgresSettings(databaseFile);
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
          if (checkpointedByThread.has(filename)) conn.pragma('wal_autocheckpoint = 0');
          done(null, conn);
        } catch (e) {
          done(e as Error, conn);
        }
      },
    },
    migrations: { migrationSource },
  };
}

interface KnexTransactionInternals {
  begin(conn: unknown): unknown;
  query(conn: unknown, sql: string): unknown;
}

/**
 * SQLite transactions begin IMMEDIATE (take the write lock first, waiting out busy_timeout) rather than
 * Knex's deferred BEGIN. A deferred transaction that reads, then writes after another connection (the
 * collab writer, a backup, a second process) has committed, fails at once with SQLITE_BUSY_SNAPSHOT: no
 * busy timeout can save it. tests/faults/busy.test.ts shows both.
 */
function beginImmediate(knex: Knex): void {
  const client = knex.client as unknown as { transaction(...args: unknown[]): KnexTransactionInternals };
  const transaction = client.transaction.bind(client);
  client.transaction = (...args: unknown[]) => {
    const trx = transaction(...args);
    trx.begin = (conn: unknown) => trx.query(conn, 'BEGIN IMMEDIATE;');
    return trx;
  };
}

/** Open the database: PostgreSQL for a postgres:// address, else the SQLite file (its folder created first). */
export function createKnex(databaseFile: string, databaseUrl?: string): Knex {
  const settings = databaseSettings(databaseFile, databaseUrl);
  if (settings.client !== 'better-sqlite3') return knexFactory(settings);
  if (databaseFile !== ':memory:') mkdirSync(dirname(resolve(databaseFile)), { recursive: true });
  const knex = knexFactory(settings);
  beginImmediate(knex);
  return knex;
}

/** True when `knex` talks to PostgreSQL. */
export function isPostgres(knex: Knex): boolean {
  return (knex.client as { config?: { client?: unknown } }).config?.client === 'pg';
}

/** Apply every pending migration; returns the names applied now. */
export async function migrateLatest(knex: Knex): Promise<string[]> {
  const [, applied] = (await knex.migrate.latest({ migrationSource })) as [number, string[]];
  return applied;
}
