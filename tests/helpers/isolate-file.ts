/**
 * Setup file of the API and browser projects: before a file's first test, the app database is put back
 * to the seeded snapshot the test script took (scripts/stack/db-snapshot.ts).
 */
import { beforeAll } from 'vitest';
import knexFactory from 'knex';
import { knexConfig } from '../../knexfile.ts';
import { restoreDatabase } from '../../scripts/stack/db-snapshot.ts';

beforeAll(async () => {
  const snapshot = process.env.DB_SNAPSHOT_NAME;
  const app = process.env.DB_NAME;
  if (!snapshot || !app) throw new Error('DB_SNAPSHOT_NAME/DB_NAME are not set: run the suite with `npm test`.');
  const knex = knexFactory(knexConfig(process.env));
  try {
    await restoreDatabase(knex, snapshot, app);
  } finally {
    await knex.destroy();
  }
}, 60_000);
