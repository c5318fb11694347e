import type { APIRoute } from 'astro';
import { compareQuerySchema } from '../../../../lib/schemas/design.ts';
import { compareDesignParts } from '../../../../server/services/design-compare.ts';
import { readQuery, routeId, signedInUser } from '../../../../server/http/request.ts';

/**
 * GET /api/designs/:id/compare?role=switch&ids=3,7[&includePending=true]: up to four parts of one role
 * side by side at the design's saved revision, each with its verdict and every check (the match's own).
 */
export const GET: APIRoute = async ({ params, url, locals }) => {
  const user = signedInUser(locals);
  const id = routeId(params.id, 'The design');
  return Response.json(await compareDesignParts(user, id, readQuery(url, compareQuerySchema)));
};
