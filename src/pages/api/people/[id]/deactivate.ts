import type { APIRoute } from 'astro';
import { jsonError, readJson } from '../../../../server/http/responses.ts';
import { db } from '../../../../server/db.ts';
import { emptyBody, personId } from '../../../../server/auth/schemas.ts';
import { deactivatePerson } from '../../../../server/services/people.ts';
import { serviceErrorResponse } from '../../../../server/services/errors.ts';

/** POST {} → {person}: no more sign-in; every session and open link of the person ends. */
export const POST: APIRoute = async (context) => {
  const id = personId(context.params.id);
  if (id === null) return jsonError(404, 'There is no such person.');
  const body = await readJson(context.request, emptyBody);
  if (body instanceof Response) return body;
  try {
    return Response.json({ person: await deactivatePerson(db(), id, context.locals.user!) });
  } catch (err) {
    return serviceErrorResponse(err);
  }
};
