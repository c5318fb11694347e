import type { APIRoute } from 'astro';
import { z } from 'zod';
import { INT_UNSIGNED_MAX } from '../../../../lib/schemas/bounds.ts';
import { designInputSchema } from '../../../../lib/schemas/design.ts';
import { getDesign, updateDesign } from '../../../../server/services/designs.ts';
import { readJson, readQuery, routeId, signedInUser } from '../../../../server/http/request.ts';

const getQuery = z.object({ revision: z.coerce.number().int().min(1).optional() });
const putBody = z.object({ version: z.number().int().min(1).max(INT_UNSIGNED_MAX), input: designInputSchema });

/** GET /api/designs/:id (?revision=n for an earlier one). */
export const GET: APIRoute = async ({ params, url }) => {
  const id = routeId(params.id, 'The design');
  const { revision } = readQuery(url, getQuery);
  return Response.json(await getDesign(id, revision));
};

/** PUT /api/designs/:id {version, input}: saves a changed input as a new revision; stale version → 409. */
export const PUT: APIRoute = async ({ params, request, locals }) => {
  const user = signedInUser(locals);
  const id = routeId(params.id, 'The design');
  const body = await readJson(request, putBody);
  return Response.json(await updateDesign(user, id, body.input, body.version));
};
