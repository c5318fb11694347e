/** What scripts/test.mjs hands the API and browser tests: the app URL and the database it runs on. */
import knexFactory, { type Knex } from 'knex';
import { knexConfig } from '../../knexfile.ts';
import { describeInstance, startMariaDb, stopMariaDb, adminPing } from '../../scripts/stack/mariadb.ts';

export function appUrl(): string {
  const url = process.env.STALLPOINT_URL;
  if (!url) throw new Error('STALLPOINT_URL is not set: run the suite with `npm test`.');
  return url;
}

/** A knex instance on the app's own test database. Destroy it in afterAll. */
export function appDb(): Knex {
  return knexFactory(knexConfig(process.env));
}

/** A knex instance on the scratch database (for migration and seed tests that must not disturb the app). */
export function scratchDb(): Knex {
  const name = process.env.DB_SCRATCH_NAME;
  if (!name) throw new Error('DB_SCRATCH_NAME is not set: run the suite with `npm test`.');
  return knexFactory(knexConfig({ ...process.env, DB_NAME: name }));
}

function instance() {
  const dir = process.env.MARIADB_DATADIR;
  const port = Number(process.env.MARIADB_PORT);
  if (!dir || !port) throw new Error('MARIADB_DATADIR/MARIADB_PORT are not set: run the suite with `npm test`.');
  return describeInstance(dir, port);
}

export async function stopDatabase(): Promise<void> {
  await stopMariaDb(instance());
}

export async function startDatabase(): Promise<void> {
  const db = instance();
  if (!adminPing(db)) await startMariaDb(db);
}
