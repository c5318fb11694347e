import type { APIRoute } from 'astro';
import { db } from '../../../server/db.ts';
import { tokenPasswordBody } from '../../../server/auth/schemas.ts';
import { acceptInvite } from '../../../server/services/people-accounts.ts';
import { setSessionCookie } from '../../../server/auth/session-cookie.ts';
import { readJson } from '../../../server/http/request.ts';

/** POST {token, password}: the invitee sets a first password and is signed in. */
export const POST: APIRoute = async (context) => {
  const body = await readJson(context.request, tokenPasswordBody);
  const fresh = await acceptInvite(db(), { ...body, clientAddress: context.clientAddress });
  setSessionCookie(context.cookies, context.url, fresh.token, fresh.session.expiresAt);
  const { email, name, roles } = fresh.user;
  return Response.json({ user: { email, name, roles } }, { headers: { 'Cache-Control': 'no-store' } });
};
