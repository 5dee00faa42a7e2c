/**
 * For the knex command line (`npx tsx node_modules/knex/bin/cli.js --knexfile knexfile.ts migrate:list`):
 * the same SQLite settings and migration list as the server. `npm run db:migrate` does the usual job.
 */
import { mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { databaseSettings } from './server/db';

const databaseFile = process.env.DATABASE_FILE || 'db/matchloom.sqlite3';
if (databaseFile !== ':memory:') mkdirSync(dirname(resolve(databaseFile)), { recursive: true });

export default databaseSettings(databaseFile);
