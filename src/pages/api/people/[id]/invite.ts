import type { APIRoute } from 'astro';
import { jsonError, readJson } from '../../../../server/http/responses.ts';
import { db } from '../../../../server/db.ts';
import { emptyBody, personId } from '../../../../server/auth/schemas.ts';
import { resendInvite } from '../../../../server/services/people.ts';
import { serviceErrorResponse } from '../../../../server/services/errors.ts';
import { publicBaseUrl } from '../../../../server/mail/config.ts';

/** POST {} → {person, mailSent}: a fresh 72 h link; the earlier one stops working. */
export const POST: APIRoute = async (context) => {
  const id = personId(context.params.id);
  if (id === null) return jsonError(404, 'There is no such person.');
  const body = await readJson(context.request, emptyBody);
  if (body instanceof Response) return body;
  try {
    return Response.json(await resendInvite(db(), id, context.locals.user!, publicBaseUrl(context.url.origin)));
  } catch (err) {
    return serviceErrorResponse(err);
  }
};
