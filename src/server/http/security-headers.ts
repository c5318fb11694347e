/**
 * Security headers sent on every response (pages, API and static files).
 * OWASP ASVS 5.0 V3.4.1 (HSTS), V3.4.3 (CSP), V3.4.4 (nosniff), V3.4.5 (Referrer-Policy), V3.4.6 (frame-ancestors).
 *
 * Pages: Astro's experimental CSP (astro.config.mjs) sends the Content-Security-Policy header itself,
 * made of CSP_DIRECTIVES plus script-src / style-src listing 'self' and the SHA-256 of every inline
 * script and style it emits (island bootstrap, island styles): no 'unsafe-inline'. Everything else
 * (JSON, redirects, static files) gets the same directives with plain 'self' sources below.
 */
export const CSP_DIRECTIVES = [
  "default-src 'self'",
  "img-src 'self' data:",
  "font-src 'self'",
  "connect-src 'self'",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
] as const;

export const SECURITY_HEADERS: Readonly<Record<string, string>> = {
  'Content-Security-Policy': [...CSP_DIRECTIVES, "script-src 'self'", "style-src 'self'"].join('; '),
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'strict-origin-when-cross-origin',
  'X-Frame-Options': 'DENY',
  'Cross-Origin-Opener-Policy': 'same-origin',
  'Permissions-Policy': 'camera=(), microphone=(), geolocation=()',
};

/** One year, subdomains included (RFC 6797 §6.1); only sent when the app is served over HTTPS. */
export const HSTS_VALUE = 'max-age=31536000; includeSubDomains';

/** The headers for an app served at publicUrl (PUBLIC_URL): HSTS added when that address is https. */
export function securityHeaders(publicUrl: string | null): Readonly<Record<string, string>> {
  if (!publicUrl || !/^https:\/\//i.test(publicUrl)) return SECURITY_HEADERS;
  return { ...SECURITY_HEADERS, 'Strict-Transport-Security': HSTS_VALUE };
}
