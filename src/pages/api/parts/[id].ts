import type { APIRoute } from 'astro';
import { z } from 'zod';
import { partUpdateSchema } from '../../../lib/schemas/parts.ts';
import { deletePart, getPart, updatePart } from '../../../server/services/parts.ts';
import { readJson, readQuery, routeId, signedInUser } from '../../../server/http/request.ts';

/** GET /api/parts/:id: 404 for a part the viewer may not see (another person's draft, proposal or rejected part). */
export const GET: APIRoute = async ({ params, locals }) => {
  return Response.json(await getPart(locals.user ?? null, routeId(params.id)), { headers: { 'Cache-Control': 'no-store' } });
};

/** PUT /api/parts/:id: the whole record with the version it was loaded at (stale → 409). */
export const PUT: APIRoute = async ({ params, request, locals }) => {
  const user = signedInUser(locals);
  const id = routeId(params.id);
  const body = await readJson(request, partUpdateSchema);
  return Response.json(await updatePart(user, id, body));
};

const deleteQuerySchema = z.strictObject({
  version: z.coerce.number({ error: 'version must be a whole number' }).int().min(1).optional(),
});

/** DELETE /api/parts/:id[?version=n]: librarians only; with a version, a stale delete is refused. */
export const DELETE: APIRoute = async ({ params, url, locals }) => {
  const user = signedInUser(locals);
  const id = routeId(params.id);
  const { version } = readQuery(url, deleteQuerySchema);
  await deletePart(user, id, version ?? null);
  return new Response(null, { status: 204 });
};
