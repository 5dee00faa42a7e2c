/**
 * `npm run backup [-- <file>]`: an online copy of DATABASE_FILE (SQLite's backup API, safe while the
 * server runs) to <file>, or to db/backups/matchloom-<UTC time>.sqlite3 beside the database.
 *
 * Restore: stop the server, delete `<DATABASE_FILE>-wal` and `<DATABASE_FILE>-shm` if present, copy the
 * backup over DATABASE_FILE, start the server (tests/faults/backup.test.ts does exactly this).
 * With DATABASE_URL (PostgreSQL) use pg_dump instead; this command copies the SQLite file only.
 */
import { existsSync, mkdirSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import Database from 'better-sqlite3';
import { ConfigError, loadConfig } from '../config';
import { BUSY_TIMEOUT_MS } from '../db';

async function main(): Promise<number> {
  let databaseFile: string;
  try {
    databaseFile = resolve(loadConfig().databaseFile);
  } catch (e) {
    if (e instanceof ConfigError) {
      process.stderr.write(`${e.message}\n`);
      return 2;
    }
    throw e;
  }
  if (!existsSync(databaseFile)) {
    process.stderr.write(`no database at ${databaseFile}\n`);
    return 2;
  }
  const stamp = new Date().toISOString().replace(/[-:]/g, '').replace(/\..*$/, '').replace('T', '-');
  const args = process.argv.slice(2).filter((a) => !a.startsWith('-'));
  const target = resolve(args[0] ?? join(dirname(databaseFile), 'backups', `matchloom-${stamp}.sqlite3`));
  if (existsSync(target)) {
    process.stderr.write(`${target} already exists; not overwriting\n`);
    return 2;
  }
  mkdirSync(dirname(target), { recursive: true });
  const db = new Database(databaseFile, { readonly: true, timeout: BUSY_TIMEOUT_MS });
  try {
    const { totalPages } = await db.backup(target);
    process.stdout.write(`backed up ${totalPages} pages to ${target}\n`);
    return 0;
  } catch (e) {
    process.stderr.write(`backup failed: ${(e as Error).message}\n`);
    return 1;
  } finally {
    db.close();
  }
}

main().then((code) => process.exit(code));
