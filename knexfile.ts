/** For the knex command line: the same SQLite settings and migration list as the server. */
import { databaseSettings } from './server/db';

export default databaseSettings(process.env.DATABASE_FILE || 'db/matchloom.sqlite3');
