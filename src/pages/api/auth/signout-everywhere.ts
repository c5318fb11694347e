import type { APIRoute } from 'astro';
import { db } from '../../../server/db.ts';
import { emptyBody } from '../../../server/auth/schemas.ts';
import { invalidateUserSessions } from '../../../server/repos/sessions.ts';
import { deleteSessionCookie } from '../../../server/auth/session-cookie.ts';
import { readJson, signedInUser } from '../../../server/http/request.ts';

/** Ends every session of the signed-in person, on every device (ASVS 5.0 V7.4.3). */
export const POST: APIRoute = async (context) => {
  await readJson(context.request, emptyBody);
  const ended = await invalidateUserSessions(db(), signedInUser(context.locals).id);
  deleteSessionCookie(context.cookies, context.url);
  return Response.json({ signedOut: true, sessionsEnded: ended }, { headers: { 'Cache-Control': 'no-store' } });
};
