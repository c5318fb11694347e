import type { APIRoute } from 'astro';
import { db } from '../../../../server/db.ts';
import { emptyBody } from '../../../../server/auth/schemas.ts';
import { deactivatePerson } from '../../../../server/services/people.ts';
import { readJson, routeId, signedInUser } from '../../../../server/http/request.ts';

/** POST {} → {person}: no more sign-in; every session and open link of the person ends. */
export const POST: APIRoute = async (context) => {
  const id = routeId(context.params.id, 'The person');
  await readJson(context.request, emptyBody);
  return Response.json({ person: await deactivatePerson(db(), id, signedInUser(context.locals)) });
};
