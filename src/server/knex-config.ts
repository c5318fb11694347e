import type { Knex } from 'knex';
import { dbConfigFromEnv } from './config.ts';
import { mysql2WithQueryTimeout } from './knex-client.ts';

/**
 * Client, connection and pool settings shared by the app, the scripts and the tests. Every statement
 * and every wait for a connection is bounded by DB_QUERY_TIMEOUT_MS (src/server/knex-client.ts), so a
 * frozen database gives errors the middleware answers with 503, not requests that hang.
 * `statementDeadline: false` (migrations and seeds, which may run long statements) keeps plain mysql2.
 */
export function knexConnectionConfig(env?: NodeJS.ProcessEnv, options: { statementDeadline?: boolean } = {}): Knex.Config {
  const db = dbConfigFromEnv(env);
  const limitMs = db.queryTimeoutMs;
  return {
    client: options.statementDeadline === false ? 'mysql2' : mysql2WithQueryTimeout(limitMs),
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
      connectTimeout: limitMs,
    },
    pool: { min: 0, max: db.poolMax },
    acquireConnectionTimeout: limitMs,
  };
}
