import type { APIRoute } from 'astro';
import { sourcesUpdateSchema } from '../../../../lib/schemas/parts.ts';
import { updateSources } from '../../../../server/services/parts-workflow.ts';
import { readJson, routeId, signedInUser } from '../../../../server/http/request.ts';

/** PUT /api/parts/:id/sources {sources, version}: buyers and librarians keep supply data. */
export const PUT: APIRoute = async ({ params, request, locals }) => {
  const user = signedInUser(locals);
  const id = routeId(params.id);
  const body = await readJson(request, sourcesUpdateSchema);
  return Response.json(await updateSources(user, id, body));
};
