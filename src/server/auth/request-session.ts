/** Reads the session cookie of a request into the user and session the middleware puts into locals. */
import type { AstroCookies } from 'astro';
import type { Db } from '../db.ts';
import { validateSessionToken } from '../repos/sessions.ts';
import { deleteSessionCookie, SESSION_COOKIE, setSessionCookie } from './session-cookie.ts';
import type { SessionInfo, SessionUser } from './types.ts';

export interface RequestSession {
  user: SessionUser | null;
  session: SessionInfo | null;
}

export async function sessionFromCookies(db: Db, cookies: AstroCookies, url: URL, now: Date = new Date()): Promise<RequestSession> {
  const token = cookies.get(SESSION_COOKIE)?.value;
  if (!token) return { user: null, session: null };
  const valid = await validateSessionToken(db, token, now);
  if (!valid) {
    deleteSessionCookie(cookies, url);
    return { user: null, session: null };
  }
  // Sliding idle timeout: send the cookie again when the session's expiry moved (ASVS 5.0 V7.3.1).
  if (valid.refreshed) setSessionCookie(cookies, url, token, valid.session.expiresAt);
  return { user: valid.user, session: valid.session };
}
