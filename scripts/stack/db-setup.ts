/** Migrate to latest and seed the demo with a short-lived knex instance (the app has its own). */
import knexFactory from 'knex';
import { knexConfig } from '../../knexfile.ts';
import { seed } from '../../db/seeds/demo.ts';
import { log } from './log.ts';

export async function migrateAndSeed(env: NodeJS.ProcessEnv, options: { seed: boolean }): Promise<void> {
  const knex = knexFactory(knexConfig(env));
  try {
    const [, applied] = await knex.migrate.latest();
    if (applied.length) log(`applied ${applied.length} migration(s)`);
    if (options.seed) {
      const report = await seed(knex);
      log(report.partsAdded ? `seeded ${report.partsAdded} demo part(s)` : 'demo data already present');
    }
  } finally {
    await knex.destroy();
  }
}
