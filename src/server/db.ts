/**
 * The one knex instance of the app. Kept on globalThis so dev reloads and the bundled server share it,
 * and so the HTTP server (scripts/stack/serve.ts) can close the pool on shutdown.
 */
import knexFactory, { type Knex } from 'knex';
import { knexConnectionConfig } from './knex-config.ts';

const KEY = Symbol.for('stallpoint.knex');
const SHUTDOWN = Symbol.for('stallpoint.shutdown');

type Holder = typeof globalThis & { [KEY]?: Knex; [SHUTDOWN]?: () => Promise<void> };
const holder = globalThis as Holder;

export function db(): Knex {
  if (!holder[KEY]) {
    holder[KEY] = knexFactory(knexConnectionConfig());
    holder[SHUTDOWN] = async () => {
      const k = holder[KEY];
      holder[KEY] = undefined;
      if (k) await k.destroy();
    };
  }
  return holder[KEY];
}

export type Db = Knex | Knex.Transaction;

/** True when the database answers a trivial query within the timeout. */
export async function pingDb(timeoutMs = 2_000): Promise<boolean> {
  try {
    await Promise.race([db().raw('select 1'), new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), timeoutMs))]);
    return true;
  } catch {
    return false;
  }
}
