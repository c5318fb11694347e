import type { APIRoute } from 'astro';
import { lifecycleChangeSchema } from '../../../../lib/schemas/parts.ts';
import { changeLifecycle } from '../../../../server/services/parts-workflow.ts';
import { readJson, routeId, signedInUser } from '../../../../server/http/request.ts';

/** POST /api/parts/:id/lifecycle {lifecycle, effectiveDate, note, version}: librarians. */
export const POST: APIRoute = async ({ params, request, locals }) => {
  const user = signedInUser(locals);
  const id = routeId(params.id);
  const body = await readJson(request, lifecycleChangeSchema);
  return Response.json(await changeLifecycle(user, id, body));
};
