import type { APIRoute } from 'astro';
import { db } from '../../../server/db.ts';
import { emptyBody } from '../../../server/auth/schemas.ts';
import { invalidateSession } from '../../../server/repos/sessions.ts';
import { deleteSessionCookie } from '../../../server/auth/session-cookie.ts';
import { readJson } from '../../../server/http/request.ts';

const FORM = /^(application\/x-www-form-urlencoded|multipart\/form-data)\b/i;

/**
 * Ends this browser's session. JSON `{}` → 200 {signedOut: true}. The sign-out button in the page
 * header is a plain form (works without JavaScript; Astro's origin check guards it) → 303 to /signin.
 */
export const POST: APIRoute = async (context) => {
  const isForm = FORM.test(context.request.headers.get('content-type') ?? '');
  if (!isForm) {
    await readJson(context.request, emptyBody);
  }
  if (context.locals.session) await invalidateSession(db(), context.locals.session.id);
  deleteSessionCookie(context.cookies, context.url);
  if (isForm) return context.redirect('/signin?signedOut=1', 303);
  return Response.json({ signedOut: true }, { headers: { 'Cache-Control': 'no-store' } });
};
