import type { APIRoute } from 'astro';
import { readJson } from '../../../../server/http/responses.ts';
import { sourcesUpdateSchema } from '../../../../lib/schemas/parts.ts';
import { answer, routeId } from '../../../../server/services/errors.ts';
import { requireUser } from '../../../../server/services/parts-access.ts';
import { updateSources } from '../../../../server/services/parts-workflow.ts';

/** PUT /api/parts/:id/sources {sources, version}: buyers and librarians keep supply data. */
export const PUT: APIRoute = ({ params, request, locals }) =>
  answer(async () => {
    requireUser(locals.user);
    const id = routeId(params.id);
    const body = await readJson(request, sourcesUpdateSchema);
    if (body instanceof Response) return body;
    return Response.json(await updateSources(locals.user, id, body));
  });
