/** Migrate to latest and seed the demo with a short-lived knex instance (the app has its own). */
import knexFactory from 'knex';
import { knexConfig } from '../../knexfile.ts';
import { seed } from '../../db/seeds/demo.ts';
import { log } from './log.ts';
import { readConfig } from '../../src/server/config.ts';
import { snapshotDatabase } from './db-snapshot.ts';

/** `snapshotTo`: copy the seeded database there (the tests restore it before each file). */
export async function migrateAndSeed(env: NodeJS.ProcessEnv, options: { seed: boolean; snapshotTo?: string }): Promise<void> {
  const knex = knexFactory(knexConfig(env));
  try {
    const [, applied] = await knex.migrate.latest();
    if (applied.length) log(`applied ${applied.length} migration(s)`);
    if (options.seed) {
      const report = await seed(knex);
      log(report.partsAdded ? `seeded ${report.partsAdded} demo part(s)` : 'demo data already present');
    }
    if (options.snapshotTo) await snapshotDatabase(knex, readConfig(env).db.database, options.snapshotTo);
  } finally {
    await knex.destroy();
  }
}
