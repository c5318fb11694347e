import type { Knex } from 'knex';
import { knexConnectionConfig } from './src/server/knex-config.ts';
import { TsMigrationSource } from './db/migration-source.ts';

/**
 * Configuration for migrations and seeds (scripts and tests); connection values come from the environment.
 * No statement deadline here: a migration may legitimately run a long ALTER.
 */
export function knexConfig(env: NodeJS.ProcessEnv = process.env): Knex.Config {
  return {
    ...knexConnectionConfig(env, { statementDeadline: false }),
    migrations: { migrationSource: new TsMigrationSource(), tableName: 'knex_migrations' },
  };
}

export default knexConfig();
