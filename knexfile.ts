/**
 * For the knex command line (`npx tsx node_modules/knex/bin/cli.js --knexfile knexfile.ts migrate:list`):
 * the same settings and migration list as the server: PostgreSQL when DATABASE_URL is set, else the
 * SQLite file at DATABASE_FILE. `npm run db:migrate` does the usual job.
 */
import { mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { databaseSettings, isPostgresUrl } from './server/db';

const databaseUrl = process.env.DATABASE_URL || undefined;
const databaseFile = process.env.DATABASE_FILE || 'db/matchloom.sqlite3';
if (!isPostgresUrl(databaseUrl) && databaseFile !== ':memory:')
  mkdirSync(dirname(resolve(databaseFile)), { recursive: true });

export default databaseSettings(databaseFile, databaseUrl);
