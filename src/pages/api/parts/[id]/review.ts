import type { APIRoute } from 'astro';
import { reviewDecisionSchema } from '../../../../lib/schemas/parts.ts';
import { reviewPart } from '../../../../server/services/parts-workflow.ts';
import { noticeBaseUrl } from '../../../../server/mail/config.ts';
import { readJson, routeId, signedInUser } from '../../../../server/http/request.ts';

/** POST /api/parts/:id/review {decision: approve|reject, reason, version}: librarians. */
export const POST: APIRoute = async ({ params, request, locals, url }) => {
  const user = signedInUser(locals);
  const id = routeId(params.id);
  const body = await readJson(request, reviewDecisionSchema);
  return Response.json(await reviewPart(user, id, body, noticeBaseUrl(url.origin)));
};
