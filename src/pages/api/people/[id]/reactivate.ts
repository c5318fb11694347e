import type { APIRoute } from 'astro';
import { readJson } from '../../../../server/http/responses.ts';
import { db } from '../../../../server/db.ts';
import { emptyBody } from '../../../../server/auth/schemas.ts';
import { reactivatePerson } from '../../../../server/services/people.ts';
import { answer, routeId } from '../../../../server/services/errors.ts';

/** POST {} → {person}: the person may sign in again with their existing password. */
export const POST: APIRoute = (context) =>
  answer(async () => {
    const id = routeId(context.params.id, 'The person');
    const body = await readJson(context.request, emptyBody);
    if (body instanceof Response) return body;
    return Response.json({ person: await reactivatePerson(db(), id, context.locals.user!) });
  });
