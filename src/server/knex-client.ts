/**
 * knex's mysql2 client with a deadline on every statement. mysql2's `timeout` query option answers the
 * caller with PROTOCOL_SEQUENCE_TIMEOUT when the server stays silent that long (a frozen or unreachable
 * database), but it leaves the connection waiting for the late answer, and every later statement on it
 * would queue behind. So a timed-out connection is destroyed at once: the pool then drops it (knex
 * validates connections on acquire) and makes a fresh one when the database is back. A transaction on
 * it is rolled back by the server when the connection goes.
 */
import Client_MySQL2 from 'knex/lib/dialects/mysql2/index.js';

interface RawConnection {
  destroy(): void;
}
interface QueryObject {
  sql?: string;
  options?: Record<string, unknown>;
}
type QueryFn = (connection: RawConnection, obj: QueryObject | string) => Promise<unknown>;

export const QUERY_TIMEOUT_CODE = 'PROTOCOL_SEQUENCE_TIMEOUT';

/** A knex client class (pass it as `client`) whose statements each time out after `queryTimeoutMs`. */
export function mysql2WithQueryTimeout(queryTimeoutMs: number): typeof Client_MySQL2 {
  const baseQuery = (Client_MySQL2.prototype as unknown as { _query: QueryFn })._query;
  class Client extends Client_MySQL2 {}
  (Client.prototype as unknown as { _query: QueryFn })._query = async function (this: unknown, connection, obj) {
    const query: QueryObject = typeof obj === 'string' ? { sql: obj } : obj;
    if (query) query.options = { timeout: queryTimeoutMs, ...query.options };
    try {
      return await baseQuery.call(this, connection, query);
    } catch (err) {
      if ((err as { code?: string }).code === QUERY_TIMEOUT_CODE) connection.destroy();
      throw err;
    }
  };
  return Client;
}
