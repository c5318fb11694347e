import type { APIRoute } from 'astro';
import { db } from '../../../../server/db.ts';
import { emptyBody } from '../../../../server/auth/schemas.ts';
import { resendInvite } from '../../../../server/services/people.ts';
import { publicBaseUrl } from '../../../../server/mail/config.ts';
import { readJson, routeId, signedInUser } from '../../../../server/http/request.ts';

/** POST {} → {person, mailSent}: a fresh 72 h link; the earlier one stops working. */
export const POST: APIRoute = async (context) => {
  const id = routeId(context.params.id, 'The person');
  await readJson(context.request, emptyBody);
  return Response.json(await resendInvite(db(), id, signedInUser(context.locals), publicBaseUrl(context.url.origin)));
};
