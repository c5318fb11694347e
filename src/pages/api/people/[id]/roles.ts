import type { APIRoute } from 'astro';
import { readJson } from '../../../../server/http/responses.ts';
import { db } from '../../../../server/db.ts';
import { rolesBody } from '../../../../server/auth/schemas.ts';
import { setRoles } from '../../../../server/services/people.ts';
import { answer, routeId } from '../../../../server/services/errors.ts';

/** PUT {roles} → {person}: replaces the person's roles. */
export const PUT: APIRoute = (context) =>
  answer(async () => {
    const id = routeId(context.params.id, 'The person');
    const body = await readJson(context.request, rolesBody);
    if (body instanceof Response) return body;
    return Response.json({ person: await setRoles(db(), id, body.roles, context.locals.user!) });
  });
