import type { APIRoute } from 'astro';
import { readJson } from '../../../../server/http/responses.ts';
import { db } from '../../../../server/db.ts';
import { emptyBody } from '../../../../server/auth/schemas.ts';
import { deactivatePerson } from '../../../../server/services/people.ts';
import { answer, routeId } from '../../../../server/services/errors.ts';

/** POST {} → {person}: no more sign-in; every session and open link of the person ends. */
export const POST: APIRoute = (context) =>
  answer(async () => {
    const id = routeId(context.params.id, 'The person');
    const body = await readJson(context.request, emptyBody);
    if (body instanceof Response) return body;
    return Response.json({ person: await deactivatePerson(db(), id, context.locals.user!) });
  });
