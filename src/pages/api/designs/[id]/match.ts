import type { APIRoute } from 'astro';
import { matchRequestSchema } from '../../../../lib/schemas/design.ts';
import { matchRequest } from '../../../../server/services/designs.ts';
import { readJson, routeId } from '../../../../server/http/request.ts';

/**
 * POST /api/designs/:id/match {includePending?, input? | revision?}: ranked switch, driver and diode
 * candidates with reasons, best first, for the saved design or its unsaved edit (the design must exist).
 */
export const POST: APIRoute = async ({ params, request }) => {
  const id = routeId(params.id, 'The design');
  return Response.json(await matchRequest(id, await readJson(request, matchRequestSchema), request.signal));
};
