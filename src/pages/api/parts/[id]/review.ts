import type { APIRoute } from 'astro';
import { reviewDecisionSchema } from '../../../../lib/schemas/parts.ts';
import { reviewPart } from '../../../../server/services/parts-workflow.ts';
import { publicBaseUrl } from '../../../../server/mail/config.ts';
import { readJson, routeId, signedInUser } from '../../../../server/http/request.ts';

/** Links in the rejection notice: PUBLIC_URL, else this request's origin. */
function mailBaseUrl(origin: string): string {
  try {
    return publicBaseUrl(origin);
  } catch {
    return origin;
  }
}

/** POST /api/parts/:id/review {decision: approve|reject, reason, version}: librarians. */
export const POST: APIRoute = async ({ params, request, locals, url }) => {
  const user = signedInUser(locals);
  const id = routeId(params.id);
  const body = await readJson(request, reviewDecisionSchema);
  return Response.json(await reviewPart(user, id, body, mailBaseUrl(url.origin)));
};
