import type { APIRoute } from 'astro';
import { jsonError, readJson } from '../../../../server/http/responses.ts';
import { db } from '../../../../server/db.ts';
import { emptyBody, personId } from '../../../../server/auth/schemas.ts';
import { reactivatePerson } from '../../../../server/services/people.ts';
import { serviceErrorResponse } from '../../../../server/services/errors.ts';

/** POST {} → {person}: the person may sign in again with their existing password. */
export const POST: APIRoute = async (context) => {
  const id = personId(context.params.id);
  if (id === null) return jsonError(404, 'There is no such person.');
  const body = await readJson(context.request, emptyBody);
  if (body instanceof Response) return body;
  try {
    return Response.json({ person: await reactivatePerson(db(), id, context.locals.user!) });
  } catch (err) {
    return serviceErrorResponse(err);
  }
};
