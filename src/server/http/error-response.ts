/**
 * The one place an error becomes a response (called by the middleware around every route):
 * a ServiceError → its status in the one shape {error, issues, …details}; the database not answering →
 * 503; anything else is a bug → logged with an id, and 500 in the same shape with that id (never an empty body).
 */
import { randomUUID } from 'node:crypto';
import { jsonError } from './responses.ts';
import { ServiceError } from '../services/errors.ts';

const DB_DOWN_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'EHOSTUNREACH',
  'ENOTFOUND',
  'PROTOCOL_CONNECTION_LOST',
  // a statement got no answer within DB_QUERY_TIMEOUT_MS (src/server/knex-client.ts): frozen or overloaded
  'PROTOCOL_SEQUENCE_TIMEOUT',
  'ER_CON_COUNT_ERROR',
  // the server is going down or starting up, or killed this connection
  'ER_SERVER_SHUTDOWN',
  'ER_CONNECTION_KILLED',
]);

/** Seconds a client is asked to wait before trying again while the database is not answering. */
export const DB_RETRY_AFTER_S = 5;

/**
 * True for errors that mean the database cannot be reached (not a bad query): the network codes above,
 * mysql2's `fatal` errors (the connection itself failed, e.g. "Can't add new command when connection is
 * in closed state"), knex's timeout waiting for a connection; also when such an error is the `cause`.
 */
export function isDatabaseUnavailable(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== 'object' || depth > 3) return false;
  const e = err as { code?: string; name?: string; message?: string; fatal?: unknown; cause?: unknown };
  if (e.code && DB_DOWN_CODES.has(e.code)) return true;
  if (e.fatal === true) return true;
  if (e.name === 'KnexTimeoutError' || /Knex: Timeout acquiring a connection/.test(e.message ?? '')) return true;
  return isDatabaseUnavailable(e.cause, depth + 1);
}

/** 503 with Retry-After: JSON for API routes, a short text for pages. */
export function databaseUnavailable(api: boolean): Response {
  const headers = { 'Retry-After': String(DB_RETRY_AFTER_S), 'Cache-Control': 'no-store' };
  if (api) return jsonError(503, 'The database is not answering; try again in a moment.', [], headers);
  return new Response('Stallpoint cannot reach its database right now. Try again in a moment.', {
    status: 503,
    headers: { 'Content-Type': 'text/plain; charset=utf-8', ...headers },
  });
}

export function errorResponse(err: unknown, api: boolean): Response {
  if (err instanceof ServiceError) {
    if (!api)
      return new Response(err.message, {
        status: err.status,
        headers: { 'Content-Type': 'text/plain; charset=utf-8', 'Cache-Control': 'no-store', ...err.headers },
      });
    const res = jsonError(err.status, err.message, err.issues, err.headers);
    if (Object.keys(err.details).length === 0) return res;
    return Response.json({ error: err.message, issues: err.issues, ...err.details }, { status: err.status, headers: res.headers });
  }
  if (isDatabaseUnavailable(err)) return databaseUnavailable(api);
  // An id in the log line and in the answer, so a report of the answer finds its stack trace.
  const errorId = randomUUID();
  console.error(`[stallpoint] unhandled error ${errorId}:`, err);
  const said = `Something went wrong on the server; it has been logged as ${errorId}.`;
  if (api) return Response.json({ error: said, issues: [], errorId }, { status: 500, headers: { 'Cache-Control': 'no-store' } });
  return new Response(said, {
    status: 500,
    headers: { 'Content-Type': 'text/plain; charset=utf-8', 'Cache-Control': 'no-store' },
  });
}
