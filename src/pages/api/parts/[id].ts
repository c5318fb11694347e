import type { APIRoute } from 'astro';
import { z } from 'zod';
import { readJson } from '../../../server/http/responses.ts';
import { partUpdateSchema } from '../../../lib/schemas/parts.ts';
import { answer, readQuery, routeId } from '../../../server/services/errors.ts';
import { requireUser } from '../../../server/services/parts-access.ts';
import { deletePart, getPart, updatePart } from '../../../server/services/parts.ts';

export const GET: APIRoute = ({ params, locals }) =>
  answer(async () => {
    requireUser(locals.user);
    return Response.json(await getPart(routeId(params.id)), { headers: { 'Cache-Control': 'no-store' } });
  });

/** PUT /api/parts/:id: the whole record with the version it was loaded at (stale → 409). */
export const PUT: APIRoute = ({ params, request, locals }) =>
  answer(async () => {
    requireUser(locals.user);
    const id = routeId(params.id);
    const body = await readJson(request, partUpdateSchema);
    if (body instanceof Response) return body;
    return Response.json(await updatePart(locals.user, id, body));
  });

const deleteQuerySchema = z.strictObject({
  version: z.coerce.number({ error: 'version must be a whole number' }).int().min(1).optional(),
});

/** DELETE /api/parts/:id[?version=n]: librarians only; with a version, a stale delete is refused. */
export const DELETE: APIRoute = ({ params, url, locals }) =>
  answer(async () => {
    requireUser(locals.user);
    const id = routeId(params.id);
    const { version } = readQuery(url, deleteQuerySchema);
    await deletePart(locals.user, id, version ?? null);
    return new Response(null, { status: 204 });
  });
