/**
 * `npm run db:migrate [-- --seed]`: apply pending migrations to DATABASE_FILE (and, with --seed, create the
 * demo data if it is not there). Prints what it did; exits 2 on a bad setting.
 */
import { ConfigError, loadConfig } from '../config';
import { createKnex, migrateLatest } from '../db';
import { seedDemo } from '../../db/seeds/demo';

async function main(): Promise<number> {
  let config;
  try {
    config = loadConfig();
  } catch (e) {
    if (e instanceof ConfigError) {
      process.stderr.write(`${e.message}\n`);
      return 2;
    }
    throw e;
  }
  const knex = createKnex(config.databaseFile, config.databaseUrl);
  try {
    const applied = await migrateLatest(knex);
    process.stdout.write(applied.length ? `applied: ${applied.join(', ')}\n` : 'already up to date\n');
    if (process.argv.includes('--seed')) {
      const { created } = await seedDemo(knex, { bcryptCost: config.bcryptCost });
      process.stdout.write(created ? 'demo data created\n' : 'demo data already present\n');
    }
    return 0;
  } catch (e) {
    process.stderr.write(`migration failed: ${(e as Error).message}\n`);
    return 1;
  } finally {
    await knex.destroy();
  }
}

main().then((code) => process.exit(code));
