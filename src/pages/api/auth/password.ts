import type { APIRoute } from 'astro';
import { db } from '../../../server/db.ts';
import { passwordChangeBody } from '../../../server/auth/schemas.ts';
import { changePassword } from '../../../server/services/people-accounts.ts';
import { setSessionCookie } from '../../../server/auth/session-cookie.ts';
import { readJson, signedInUser } from '../../../server/http/request.ts';

/** POST {currentPassword, newPassword}: every session ends; this browser gets a fresh one. */
export const POST: APIRoute = async (context) => {
  const body = await readJson(context.request, passwordChangeBody);
  const fresh = await changePassword(db(), signedInUser(context.locals), body);
  setSessionCookie(context.cookies, context.url, fresh.token, fresh.session.expiresAt);
  return Response.json({ changed: true }, { headers: { 'Cache-Control': 'no-store' } });
};
