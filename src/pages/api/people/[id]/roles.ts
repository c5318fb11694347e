import type { APIRoute } from 'astro';
import { db } from '../../../../server/db.ts';
import { rolesBody } from '../../../../server/auth/schemas.ts';
import { setRoles } from '../../../../server/services/people.ts';
import { readJson, routeId, signedInUser } from '../../../../server/http/request.ts';

/** PUT {roles} → {person}: replaces the person's roles. */
export const PUT: APIRoute = async (context) => {
  const id = routeId(context.params.id, 'The person');
  const body = await readJson(context.request, rolesBody);
  return Response.json({ person: await setRoles(db(), id, body.roles, signedInUser(context.locals)) });
};
