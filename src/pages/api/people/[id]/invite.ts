import type { APIRoute } from 'astro';
import { readJson } from '../../../../server/http/responses.ts';
import { db } from '../../../../server/db.ts';
import { emptyBody } from '../../../../server/auth/schemas.ts';
import { resendInvite } from '../../../../server/services/people.ts';
import { answer, routeId } from '../../../../server/services/errors.ts';
import { publicBaseUrl } from '../../../../server/mail/config.ts';

/** POST {} → {person, mailSent}: a fresh 72 h link; the earlier one stops working. */
export const POST: APIRoute = (context) =>
  answer(async () => {
    const id = routeId(context.params.id, 'The person');
    const body = await readJson(context.request, emptyBody);
    if (body instanceof Response) return body;
    return Response.json(await resendInvite(db(), id, context.locals.user!, publicBaseUrl(context.url.origin)));
  });
