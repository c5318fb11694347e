import type { APIRoute } from 'astro';
import { readJson } from '../../../server/http/responses.ts';
import { db } from '../../../server/db.ts';
import { passwordChangeBody } from '../../../server/auth/schemas.ts';
import { changePassword } from '../../../server/services/people-accounts.ts';
import { serviceErrorResponse } from '../../../server/services/errors.ts';
import { setSessionCookie } from '../../../server/auth/session-cookie.ts';

/** POST {currentPassword, newPassword}: every session ends; this browser gets a fresh one. */
export const POST: APIRoute = async (context) => {
  const body = await readJson(context.request, passwordChangeBody);
  if (body instanceof Response) return body;
  try {
    const fresh = await changePassword(db(), context.locals.user!, body);
    setSessionCookie(context.cookies, context.url, fresh.token, fresh.session.expiresAt);
    return Response.json({ changed: true }, { headers: { 'Cache-Control': 'no-store' } });
  } catch (err) {
    return serviceErrorResponse(err);
  }
};
