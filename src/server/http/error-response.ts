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
  'PROTOCOL_CONNECTION_LOST',
  'ER_CON_COUNT_ERROR',
  'ENOTFOUND',
]);

/** True for errors that mean the database cannot be reached (not a bad query). */
export function isDatabaseUnavailable(err: unknown): boolean {
  if (!err || typeof err !== 'object') return false;
  const e = err as { code?: string; name?: string; message?: string };
  if (e.code && DB_DOWN_CODES.has(e.code)) return true;
  return e.name === 'KnexTimeoutError' || /Knex: Timeout acquiring a connection/.test(e.message ?? '');
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
  if (isDatabaseUnavailable(err)) {
    if (api) return jsonError(503, 'The database is not answering; try again in a moment.', [], { 'Retry-After': '5' });
    return new Response('Stallpoint cannot reach its database right now. Try again in a moment.', {
      status: 503,
      headers: { 'Content-Type': 'text/plain; charset=utf-8', 'Cache-Control': 'no-store', 'Retry-After': '5' },
    });
  }
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
