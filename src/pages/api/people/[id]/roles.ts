import type { APIRoute } from 'astro';
import { jsonError, readJson } from '../../../../server/http/responses.ts';
import { db } from '../../../../server/db.ts';
import { personId, rolesBody } from '../../../../server/auth/schemas.ts';
import { setRoles } from '../../../../server/services/people.ts';
import { serviceErrorResponse } from '../../../../server/services/errors.ts';

/** PUT {roles} → {person}: replaces the person's roles. */
export const PUT: APIRoute = async (context) => {
  const id = personId(context.params.id);
  if (id === null) return jsonError(404, 'There is no such person.');
  const body = await readJson(context.request, rolesBody);
  if (body instanceof Response) return body;
  try {
    return Response.json({ person: await setRoles(db(), id, body.roles, context.locals.user!) });
  } catch (err) {
    return serviceErrorResponse(err);
  }
};
