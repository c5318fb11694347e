/**
 * Signed-in sessions for API and browser tests, made through the real sign-in API
 * (POST /api/auth/signin with a demo person's e-mail and password), one per role per test file.
 */
import request from 'supertest';
import type { BrowserContext } from 'playwright-core';
import { appUrl } from './stack.ts';

import { DEMO_DOMAIN, DEMO_PASSWORD } from '../../db/seeds/demo.ts';
import type { Role } from '../../src/lib/domain/roles.ts';

export type DemoRole = Role;
export { DEMO_PASSWORD };
export const demoAddress = (role: DemoRole): string => `${role}@${DEMO_DOMAIN}`;

const cache = new Map<DemoRole, string>();

/** The Cookie header value of a fresh session for the demo person holding `role`. */
export async function sessionCookie(role: DemoRole): Promise<string> {
  const known = cache.get(role);
  if (known) return known;
  const res = await request(appUrl())
    .post('/api/auth/signin')
    .set('Content-Type', 'application/json')
    .send(JSON.stringify({ email: demoAddress(role), password: DEMO_PASSWORD }));
  if (res.status !== 200) throw new Error(`sign-in as ${role} answered ${res.status}: ${JSON.stringify(res.body)}`);
  const cookie = ([] as string[])
    .concat(res.headers['set-cookie'] ?? [])
    .map((c) => c.split(';')[0])
    .find((c) => /^stallpoint_session=./.test(c));
  if (!cookie) throw new Error(`sign-in as ${role} set no session cookie`);
  cache.set(role, cookie);
  return cookie;
}

/** Puts the role's session cookie into a browser context. */
export async function signInContext(context: BrowserContext, role: DemoRole): Promise<void> {
  const [name, value] = (await sessionCookie(role)).split(/=(.*)/s);
  await context.addCookies([{ name, value, url: appUrl() }]);
}
