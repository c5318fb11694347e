import type { APIRoute } from 'astro';
import { readJson } from '../../../server/http/responses.ts';
import { db } from '../../../server/db.ts';
import { tokenPasswordBody } from '../../../server/auth/schemas.ts';
import { acceptInvite } from '../../../server/services/people-accounts.ts';
import { serviceErrorResponse } from '../../../server/services/errors.ts';
import { setSessionCookie } from '../../../server/auth/session-cookie.ts';

/** POST {token, password}: the invitee sets a first password and is signed in. */
export const POST: APIRoute = async (context) => {
  const body = await readJson(context.request, tokenPasswordBody);
  if (body instanceof Response) return body;
  try {
    const fresh = await acceptInvite(db(), body.token, body.password);
    setSessionCookie(context.cookies, context.url, fresh.token, fresh.session.expiresAt);
    const { email, name, roles } = fresh.user;
    return Response.json({ user: { email, name, roles } }, { headers: { 'Cache-Control': 'no-store' } });
  } catch (err) {
    return serviceErrorResponse(err);
  }
};
