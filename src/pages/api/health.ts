import type { APIRoute } from 'astro';
import { pingDb } from '../../server/db.ts';
import { DB_RETRY_AFTER_S } from '../../server/http/error-response.ts';

/** Liveness and database check for load balancers and the start script; 503 with Retry-After while the database is away. */
export const GET: APIRoute = async () => {
  const ok = await pingDb();
  const headers: Record<string, string> = { 'Cache-Control': 'no-store' };
  if (!ok) headers['Retry-After'] = String(DB_RETRY_AFTER_S);
  return Response.json({ db: ok ? 'ok' : 'unavailable' }, { status: ok ? 200 : 503, headers });
};
