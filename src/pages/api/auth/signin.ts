import type { APIRoute } from 'astro';
import { db } from '../../../server/db.ts';
import { signInBody } from '../../../server/auth/schemas.ts';
import { signIn } from '../../../server/auth/signin.ts';
import { setSessionCookie } from '../../../server/auth/session-cookie.ts';
import { invalidateSession } from '../../../server/repos/sessions.ts';
import { readJson } from '../../../server/http/request.ts';
import { jsonError } from '../../../server/http/responses.ts';

/** POST {email, password} → 200 {user} and the session cookie; 401 one generic answer; 429 with Retry-After. */
export const POST: APIRoute = async (context) => {
  const body = await readJson(context.request, signInBody);
  const result = await signIn(db(), { ...body, clientAddress: context.clientAddress });
  if (result.kind === 'limited') {
    const minutes = Math.ceil(result.retryAfterSeconds / 60);
    return jsonError(429, `Too many sign-in attempts. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`, [], {
      'Retry-After': String(result.retryAfterSeconds),
    });
  }
  if (result.kind === 'invalid') return jsonError(401, 'The e-mail address or the password is not right.');
  // A new session on every sign-in; the one this browser had before ends (ASVS 5.0 V7.2.4).
  if (context.locals.session) await invalidateSession(db(), context.locals.session.id);
  setSessionCookie(context.cookies, context.url, result.token, result.session.expiresAt);
  const { email, name, roles } = result.user;
  return Response.json({ user: { email, name, roles } }, { headers: { 'Cache-Control': 'no-store' } });
};
