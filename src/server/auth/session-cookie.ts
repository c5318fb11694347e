/**
 * The session cookie: HttpOnly, SameSite=Lax, Path=/, Secure when served over HTTPS, expiring with the
 * session. OWASP ASVS 5.0 V3.3.1 (Secure), V3.3.2 (SameSite), V3.3.4 (HttpOnly).
 */
import type { AstroCookies } from 'astro';
import { appConfig, readConfig } from '../config.ts';

export const SESSION_COOKIE = 'stallpoint_session';

/** HTTPS when the request came in over TLS, or when the public address of the app is https. */
export function isSecureOrigin(url: URL, env?: NodeJS.ProcessEnv): boolean {
  const publicUrl = (env ? readConfig(env) : appConfig()).publicUrl ?? '';
  return url.protocol === 'https:' || publicUrl.startsWith('https:');
}

export function setSessionCookie(cookies: AstroCookies, url: URL, token: string, expiresAt: Date): void {
  cookies.set(SESSION_COOKIE, token, { httpOnly: true, sameSite: 'lax', path: '/', secure: isSecureOrigin(url), expires: expiresAt });
}

export function deleteSessionCookie(cookies: AstroCookies, url: URL): void {
  cookies.set(SESSION_COOKIE, '', { httpOnly: true, sameSite: 'lax', path: '/', secure: isSecureOrigin(url), maxAge: 0 });
}
