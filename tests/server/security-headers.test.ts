/**
 * HSTS (RFC 6797; OWASP ASVS 5.0 V3.4.1) is sent when the configured PUBLIC_URL is https, and only then:
 * a browser that saw it over plain http would ignore it, and sending it for a local http address could
 * lock a developer's localhost into https. Expected values written out by hand from RFC 6797 §6.1.
 */
import { describe, expect, it } from 'vitest';
import { readConfig } from '../../src/server/config.ts';
import { SECURITY_HEADERS, securityHeaders } from '../../src/server/http/security-headers.ts';

const headersFor = (env: NodeJS.ProcessEnv) => securityHeaders(readConfig(env).publicUrl);

describe('securityHeaders(PUBLIC_URL)', () => {
  it('https PUBLIC_URL: Strict-Transport-Security for one year with subdomains, beside the usual headers', () => {
    const h = headersFor({ PUBLIC_URL: 'https://stallpoint.example.org' });
    expect(h['Strict-Transport-Security']).toBe('max-age=31536000; includeSubDomains');
    expect(h['X-Content-Type-Options']).toBe('nosniff');
    expect(h['Content-Security-Policy']).toBe(SECURITY_HEADERS['Content-Security-Policy']);
  });

  it.each([
    ['no PUBLIC_URL', {}],
    ['an http PUBLIC_URL', { PUBLIC_URL: 'http://127.0.0.1:4321' }],
  ])('%s: no HSTS', (_what, env) => {
    expect(headersFor(env)).not.toHaveProperty('Strict-Transport-Security');
    expect(headersFor(env)['X-Frame-Options']).toBe('DENY');
  });
});
