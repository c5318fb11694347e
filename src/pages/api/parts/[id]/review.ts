import type { APIRoute } from 'astro';
import { readJson } from '../../../../server/http/responses.ts';
import { reviewDecisionSchema } from '../../../../lib/schemas/parts.ts';
import { answer, routeId } from '../../../../server/services/errors.ts';
import { requireUser } from '../../../../server/services/parts-access.ts';
import { reviewPart } from '../../../../server/services/parts-workflow.ts';
import { publicBaseUrl } from '../../../../server/mail/config.ts';

/** Links in the rejection notice: PUBLIC_URL, else this request's origin. */
function mailBaseUrl(origin: string): string {
  try {
    return publicBaseUrl(origin);
  } catch {
    return origin;
  }
}

/** POST /api/parts/:id/review {decision: approve|reject, reason, version}: librarians. */
export const POST: APIRoute = ({ params, request, locals, url }) =>
  answer(async () => {
    requireUser(locals.user);
    const id = routeId(params.id);
    const body = await readJson(request, reviewDecisionSchema);
    if (body instanceof Response) return body;
    return Response.json(await reviewPart(locals.user, id, body, mailBaseUrl(url.origin)));
  });
