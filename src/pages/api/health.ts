import type { APIRoute } from 'astro';
import { pingDb } from '../../server/db.ts';

/** Liveness and database check for load balancers and the start script. */
export const GET: APIRoute = async () => {
  const ok = await pingDb();
  return Response.json({ db: ok ? 'ok' : 'unavailable' }, { status: ok ? 200 : 503, headers: { 'Cache-Control': 'no-store' } });
};
