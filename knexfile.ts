import type { Knex } from 'knex';
import { knexConnectionConfig } from './src/server/knex-config.ts';
import { TsMigrationSource } from './db/migration-source.ts';

/** Configuration for migrations and seeds (scripts and tests); connection values come from the environment. */
export function knexConfig(env: NodeJS.ProcessEnv = process.env): Knex.Config {
  return {
    ...knexConnectionConfig(env),
    migrations: { migrationSource: new TsMigrationSource(), tableName: 'knex_migrations' },
  };
}

export default knexConfig();
