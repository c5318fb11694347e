/**
 * Security headers sent on every response (pages, API and static files).
 * OWASP ASVS 5.0 V3.4 (browser security mechanism headers).
 * Scripts and styles are same-origin files; Astro's island bootstrap is allowed by the hashes Astro
 * puts in its own CSP meta tag (experimental.csp), so no 'unsafe-inline' for scripts here.
 */
export const SECURITY_HEADERS: Readonly<Record<string, string>> = {
  'Content-Security-Policy':
    "default-src 'self'; img-src 'self' data:; font-src 'self'; connect-src 'self'; object-src 'none'; " +
    "base-uri 'self'; form-action 'self'; frame-ancestors 'none'",
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'strict-origin-when-cross-origin',
  'X-Frame-Options': 'DENY',
  'Cross-Origin-Opener-Policy': 'same-origin',
  'Permissions-Policy': 'camera=(), microphone=(), geolocation=()',
};
