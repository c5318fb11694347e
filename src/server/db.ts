/**
 * The knex instances of the app, all made here: the main one on the primary (every write and every read
 * that is not sent to the replica), one on the read replica when DB_REPLICA_HOST names one (search and
 * catalogue reads, through onReadDb), and a tiny one of a single connection for the health check alone,
 * so /api/health answers even while every connection of the main pool is busy (long matches, imports).
 * Kept on globalThis so dev reloads and the bundled server share them, and so the HTTP server
 * (scripts/stack/serve.ts) can close every pool on shutdown.
 */
import knexFactory, { type Knex } from 'knex';
import { knexConnectionConfig } from './knex-config.ts';
import { appConfig } from './config.ts';
import { isDatabaseUnavailable } from './http/error-response.ts';

const KEY = Symbol.for('stallpoint.knex');
const READ_KEY = Symbol.for('stallpoint.knex.replica');
const HEALTH_KEY = Symbol.for('stallpoint.knex.health');
const SHUTDOWN = Symbol.for('stallpoint.shutdown');
const REPLICA_DOWN = Symbol.for('stallpoint.replica.downUntil');

type Holder = typeof globalThis & {
  [KEY]?: Knex;
  [READ_KEY]?: Knex;
  [HEALTH_KEY]?: Knex;
  [SHUTDOWN]?: () => Promise<void>;
  [REPLICA_DOWN]?: number;
};
const holder = globalThis as Holder;

/** Bound of connecting to the replica (ms): a replica that is down must not hold up the fallback. */
export const REPLICA_CONNECT_TIMEOUT_MS = 1_000;
/** After the replica failed to answer, reads go to the primary for this long before the replica is tried again (ms). */
export const REPLICA_RETRY_MS = 5_000;

/** Bound of the health check's connect, wait and query (ms): a load balancer wants a quick answer. */
export const HEALTH_TIMEOUT_MS = 2_000;

function installShutdown(): void {
  holder[SHUTDOWN] ??= async () => {
    const main = holder[KEY];
    const read = holder[READ_KEY];
    const health = holder[HEALTH_KEY];
    holder[KEY] = undefined;
    holder[READ_KEY] = undefined;
    holder[HEALTH_KEY] = undefined;
    await Promise.all([main?.destroy(), read?.destroy(), health?.destroy()]);
  };
}

export function db(): Knex {
  if (!holder[KEY]) {
    holder[KEY] = knexFactory(knexConnectionConfig());
    installShutdown();
  }
  return holder[KEY];
}

/** The replica's pool (same database, user and password), or null when no replica is configured. */
function replicaDb(): Knex | null {
  const replica = appConfig().dbReplica;
  if (!replica) return null;
  if (!holder[READ_KEY]) {
    const base = knexConnectionConfig();
    holder[READ_KEY] = knexFactory({
      ...base,
      connection: { ...(base.connection as object), host: replica.host, port: replica.port, connectTimeout: REPLICA_CONNECT_TIMEOUT_MS },
    });
    installShutdown();
  }
  return holder[READ_KEY];
}

/**
 * Runs a read that may be a little behind the latest write (search, catalogue pages) on the replica when
 * one is configured, else on the primary. When the replica cannot be reached (the same errors that make
 * the primary answer 503) the read runs on the primary instead, and the replica is left alone for
 * REPLICA_RETRY_MS. A read must not write: the replica is read_only.
 */
export async function onReadDb<T>(read: (k: Knex) => Promise<T>): Promise<T> {
  const replica = replicaDb();
  if (replica && Date.now() >= (holder[REPLICA_DOWN] ?? 0)) {
    try {
      return await read(replica);
    } catch (err) {
      if (!isDatabaseUnavailable(err)) throw err;
      holder[REPLICA_DOWN] = Date.now() + REPLICA_RETRY_MS;
      console.warn(
        `[stallpoint] read replica not answering (${(err as Error).message}); reading from the primary for ${REPLICA_RETRY_MS / 1000} s`,
      );
    }
  }
  return read(db());
}

/** The health check's own pool: one connection, short timeouts, never shared with the app's queries. */
function healthDb(): Knex {
  if (!holder[HEALTH_KEY]) {
    const base = knexConnectionConfig();
    holder[HEALTH_KEY] = knexFactory({
      ...base,
      connection: { ...(base.connection as object), connectTimeout: HEALTH_TIMEOUT_MS },
      pool: { min: 0, max: 1 },
      acquireConnectionTimeout: HEALTH_TIMEOUT_MS,
    });
    installShutdown();
  }
  return holder[HEALTH_KEY];
}

export type Db = Knex | Knex.Transaction;

/** True when the database answers a trivial query within the timeout, on the health check's own connection. */
export async function pingDb(timeoutMs = HEALTH_TIMEOUT_MS): Promise<boolean> {
  try {
    await Promise.race([healthDb().raw('select 1'), new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), timeoutMs))]);
    return true;
  } catch {
    return false;
  }
}
