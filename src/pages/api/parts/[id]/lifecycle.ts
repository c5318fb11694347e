import type { APIRoute } from 'astro';
import { readJson } from '../../../../server/http/responses.ts';
import { lifecycleChangeSchema } from '../../../../lib/schemas/parts.ts';
import { answer, routeId } from '../../../../server/services/errors.ts';
import { requireUser } from '../../../../server/services/parts-access.ts';
import { changeLifecycle } from '../../../../server/services/parts-workflow.ts';

/** POST /api/parts/:id/lifecycle {lifecycle, effectiveDate, note, version}: librarians. */
export const POST: APIRoute = ({ params, request, locals }) =>
  answer(async () => {
    requireUser(locals.user);
    const id = routeId(params.id);
    const body = await readJson(request, lifecycleChangeSchema);
    if (body instanceof Response) return body;
    return Response.json(await changeLifecycle(locals.user, id, body));
  });
