/** Shared by the auth and role tests: people, sessions and captured mail on the test database. */
import type { Knex } from 'knex';
import request from 'supertest';
import { appUrl } from '../helpers/stack.ts';
import { hashPassword } from '../../src/server/auth/password.ts';
import { createSession } from '../../src/server/repos/sessions.ts';
import { SESSION_COOKIE } from '../../src/server/auth/session-cookie.ts';
import type { Role } from '../../src/server/auth/types.ts';

export { DEMO_PASSWORD, demoAddress as demoEmail } from '../helpers/session.ts';

let counter = 0;
/** A unique address at the invented demo domain, so tests never collide with each other or the demo. */
export function uniqueEmail(prefix: string): string {
  counter += 1;
  return `${prefix}.${Date.now().toString(36)}${counter}@kestrel-fluidics.example`;
}

export async function createPerson(knex: Knex, input: { email: string; password: string; roles: Role[]; name?: string }): Promise<number> {
  const [id] = await knex('users').insert({
    email: input.email,
    name: input.name ?? 'Test Person',
    password_hash: await hashPassword(input.password),
  });
  if (input.roles.length) await knex('user_roles').insert(input.roles.map((role) => ({ user_id: id, role })));
  return Number(id);
}

export async function userId(knex: Knex, email: string): Promise<number> {
  return (await knex('users').where({ email }).first('id')).id;
}

/** A cookie header for a fresh session made by the session service itself (no sign-in, no rate limit). */
export async function sessionCookie(knex: Knex, email: string): Promise<string> {
  const { token } = await createSession(knex, await userId(knex, email));
  return `${SESSION_COOKIE}=${token}`;
}

/** Signs in through the API; returns the cookie header to send back and the raw token. */
export async function signIn(email: string, password: string): Promise<{ status: number; cookie: string; token: string }> {
  const res = await request(appUrl()).post('/api/auth/signin').set('Content-Type', 'application/json').send({ email, password });
  const setCookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith(`${SESSION_COOKIE}=`)) ?? '';
  const token = setCookie.split(';')[0].slice(SESSION_COOKIE.length + 1);
  return { status: res.status, cookie: `${SESSION_COOKIE}=${token}`, token };
}

export async function meStatus(cookie: string): Promise<number> {
  return (await request(appUrl()).get('/api/auth/me').set('Cookie', cookie)).status;
}

export interface CapturedRow {
  id: number;
  envelope_to: string;
  subject: string;
  text_body: string;
  html_body: string;
}

/** Waits for the SMTP sink to store a message to `to` newer than `afterId`. */
export async function waitForMail(knex: Knex, to: string, afterId = 0, timeoutMs = 10_000): Promise<CapturedRow> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const row = await knex('captured_mail')
      .where('id', '>', afterId)
      .andWhere('envelope_to', 'like', `%${to}%`)
      .orderBy('id', 'desc')
      .first();
    if (row) return row;
    if (Date.now() > deadline) throw new Error(`no mail to ${to} arrived in the sink`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

export async function lastMailId(knex: Knex): Promise<number> {
  return Number((await knex('captured_mail').max({ m: 'id' }))[0].m ?? 0);
}

/** The token of the first link to `path` in a message body. */
export function tokenFrom(text: string, path: '/invite' | '/reset'): string {
  const m = new RegExp(`https?://[^\\s"<]+${path}\\?token=([a-z2-7]+)`).exec(text);
  if (!m) throw new Error(`no ${path} link in:\n${text}`);
  return m[1];
}

export function postJson(path: string, body: unknown, cookie?: string): request.Test {
  const req = request(appUrl()).post(path).set('Content-Type', 'application/json');
  if (cookie) req.set('Cookie', cookie);
  return req.send(JSON.stringify(body));
}
