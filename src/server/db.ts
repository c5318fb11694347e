/**
 * The knex instances of the app, all made here: the main one (every query of the app) and a tiny one of
 * a single connection for the health check alone, so /api/health answers even while every connection of
 * the main pool is busy (long matches, imports). Kept on globalThis so dev reloads and the bundled server
 * share them, and so the HTTP server (scripts/stack/serve.ts) can close both pools on shutdown.
 */
import knexFactory, { type Knex } from 'knex';
import { knexConnectionConfig } from './knex-config.ts';

const KEY = Symbol.for('stallpoint.knex');
const HEALTH_KEY = Symbol.for('stallpoint.knex.health');
const SHUTDOWN = Symbol.for('stallpoint.shutdown');

type Holder = typeof globalThis & { [KEY]?: Knex; [HEALTH_KEY]?: Knex; [SHUTDOWN]?: () => Promise<void> };
const holder = globalThis as Holder;

/** Bound of the health check's connect, wait and query (ms): a load balancer wants a quick answer. */
export const HEALTH_TIMEOUT_MS = 2_000;

function installShutdown(): void {
  holder[SHUTDOWN] ??= async () => {
    const main = holder[KEY];
    const health = holder[HEALTH_KEY];
    holder[KEY] = undefined;
    holder[HEALTH_KEY] = undefined;
    await Promise.all([main?.destroy(), health?.destroy()]);
  };
}

export function db(): Knex {
  if (!holder[KEY]) {
    holder[KEY] = knexFactory(knexConnectionConfig());
    installShutdown();
  }
  return holder[KEY];
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
