import type { Knex } from 'knex';
import { dbConfigFromEnv } from './config.ts';

/** Client, connection and pool settings shared by the app, the scripts and the tests. */
export function knexConnectionConfig(env?: NodeJS.ProcessEnv): Knex.Config {
  const db = dbConfigFromEnv(env);
  return {
    client: 'mysql2',
    connection: {
      host: db.host,
      port: db.port,
      user: db.user,
      password: db.password,
      database: db.database,
      charset: 'utf8mb4',
      timezone: 'Z',
      supportBigNumbers: true,
      bigNumberStrings: false,
      decimalNumbers: true,
      connectTimeout: 5_000,
    },
    pool: { min: 0, max: db.poolMax },
    acquireConnectionTimeout: 5_000,
  };
}
