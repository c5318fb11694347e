import type { APIRoute } from 'astro';
import { db } from '../../../../server/db.ts';
import { emptyBody } from '../../../../server/auth/schemas.ts';
import { reactivatePerson } from '../../../../server/services/people.ts';
import { readJson, routeId, signedInUser } from '../../../../server/http/request.ts';

/** POST {} → {person}: the person may sign in again with their existing password. */
export const POST: APIRoute = async (context) => {
  const id = routeId(context.params.id, 'The person');
  await readJson(context.request, emptyBody);
  return Response.json({ person: await reactivatePerson(db(), id, signedInUser(context.locals)) });
};
