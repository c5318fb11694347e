import type { APIRoute } from 'astro';
import { matchRequestSchema } from '../../../lib/schemas/design.ts';
import { matchRequest } from '../../../server/services/designs.ts';
import { readJson } from '../../../server/http/request.ts';

/** POST /api/designs/match {includePending?, input}: the same pipeline for a design not saved yet. */
export const POST: APIRoute = async ({ request }) => {
  return Response.json(await matchRequest(null, await readJson(request, matchRequestSchema), request.signal));
};
