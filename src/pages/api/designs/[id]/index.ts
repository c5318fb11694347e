import type { APIRoute } from 'astro';
import { z } from 'zod';
import { readJson, jsonError } from '../../../../server/http/responses.ts';
import { designInputSchema } from '../../../../lib/schemas/design.ts';
import { getDesign, updateDesign } from '../../../../server/services/designs.ts';
import { answer, readQuery, routeId } from '../../../../server/services/errors.ts';
import type { DesignInput } from '../../../../lib/domain/design.ts';

const getQuery = z.object({ revision: z.coerce.number().int().min(1).optional() });
const putBody = z.object({ version: z.number().int().min(1), input: designInputSchema });

/** GET /api/designs/:id (?revision=n for an earlier one). */
export const GET: APIRoute = ({ params, url }) =>
  answer(async () => {
    const id = routeId(params.id, 'The design');
    const { revision } = readQuery(url, getQuery);
    return Response.json(await getDesign(id, revision));
  });

/** PUT /api/designs/:id {version, input}: saves a changed input as a new revision; stale version → 409. */
export const PUT: APIRoute = ({ params, request, locals }) =>
  answer(async () => {
    if (!locals.user) return jsonError(401, 'Sign in first.');
    const id = routeId(params.id, 'The design');
    const body = await readJson(request, putBody);
    if (body instanceof Response) return body;
    return Response.json(await updateDesign(locals.user, id, body.input as DesignInput, body.version));
  });
