/** Sign-in, the session cookie, sessions stored hashed, idle and absolute expiry, sign-out (everywhere). */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { sha256 } from '@oslojs/crypto/sha2';
import { appDb, appUrl } from '../helpers/stack.ts';
import {
  createSession,
  invalidateUserSessions,
  validateSessionToken,
  SESSION_ABSOLUTE_MS,
  SESSION_IDLE_MS,
  SESSION_REFRESH_MS,
} from '../../src/server/repos/sessions.ts';
import { createPerson, demoEmail, DEMO_PASSWORD, meStatus, postJson, signIn, uniqueEmail } from './auth-helpers.ts';

const knex = appDb();
const PASSWORD = 'a long test passphrase for sessions';
let email: string;
let id: number;
beforeAll(async () => {
  email = uniqueEmail('sessions');
  id = await createPerson(knex, { email, password: PASSWORD, roles: ['designer'] });
});
afterAll(async () => {
  await knex('users').where({ id }).delete();
  await knex.destroy();
});

const HOUR_MS = 3600_000;
const DAY_MS = 24 * HOUR_MS;
const at = (t0: Date, ms: number): Date => new Date(t0.getTime() + ms);

describe('sign-in', () => {
  it('answers 200 with the person and an HttpOnly, SameSite=Lax, Path=/ cookie (ASVS 5.0 V3.3.2, V3.3.4)', async () => {
    const res = await postJson('/api/auth/signin', { email: demoEmail('buyer'), password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ user: { email: demoEmail('buyer'), name: 'Bea Lindqvist', roles: ['buyer'] } });
    const cookie = ([] as string[]).concat(res.headers['set-cookie'])[0];
    expect(cookie).toMatch(/^stallpoint_session=[a-z2-7]{32}\.[a-z2-7]{32};/);
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Lax/);
    expect(cookie).toMatch(/Path=\//);
    // Served over plain http in the tests, so no Secure flag here; isSecureOrigin() adds it on https (ASVS 5.0 V3.3.1).
    expect(cookie).not.toMatch(/Secure/);
  });

  it('gives one generic 401 for a wrong password and for an unknown address (ASVS 5.0 V6.3.8)', async () => {
    const wrong = await postJson('/api/auth/signin', { email, password: 'not the right passphrase' });
    const unknown = await postJson('/api/auth/signin', { email: uniqueEmail('nobody'), password: 'not the right passphrase' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(unknown.body).toEqual(wrong.body);
  });

  it('refuses a body that is not JSON with 415, and bad fields with 400 naming the field', async () => {
    const form = await request(appUrl()).post('/api/auth/signin').set('Origin', appUrl()).type('form').send({ email, password: PASSWORD });
    expect(form.status).toBe(415);
    const bad = await postJson('/api/auth/signin', { email: 'not-an-address', password: '' });
    expect(bad.status).toBe(400);
    expect(bad.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['email', 'password']);
  });

  it('GET /api/auth/me answers the person, or 401 without a session', async () => {
    const { cookie } = await signIn(email, PASSWORD);
    const me = await request(appUrl()).get('/api/auth/me').set('Cookie', cookie);
    expect(me.status).toBe(200);
    expect(me.body).toEqual({ user: { email, name: 'Test Person', roles: ['designer'] } });
    expect((await request(appUrl()).get('/api/auth/me')).status).toBe(401);
  });
});

describe('sessions are stored hashed (ASVS 5.0 V7.2.3: 160-bit random token; only SHA-256 of the secret at rest)', () => {
  it('keeps SHA-256(secret) and never the token or the secret', async () => {
    const { token } = await signIn(email, PASSWORD);
    const [sessionId, secret] = token.split('.');
    const row = await knex('sessions').where({ id: sessionId }).first();
    expect(Buffer.from(row.secret_hash)).toEqual(Buffer.from(sha256(new TextEncoder().encode(secret))));
    const everything =
      JSON.stringify(await knex('sessions').select('*')) +
      (await knex('sessions').select('*')).map((r) => Buffer.from(r.secret_hash).toString('latin1')).join('');
    expect(everything).not.toContain(secret);
    expect(everything).not.toContain(token);
  });

  it('refuses a token whose secret half is wrong (constant-time compare of the hashes)', async () => {
    const { token } = await signIn(email, PASSWORD);
    const forged = `${token.split('.')[0]}.${'a'.repeat(32)}`;
    expect(await meStatus(`stallpoint_session=${forged}`)).toBe(401);
    expect(await validateSessionToken(knex, forged)).toBeNull();
  });
});

describe('expiry with a controllable clock (ASVS 5.0 V7.3.1 idle, V7.3.2 absolute)', () => {
  const t0 = new Date('2027-03-01T08:00:00.000Z');

  it('ends a session idle for 7 days and deletes its row', async () => {
    const { token, session } = await createSession(knex, id, t0);
    expect(session.expiresAt).toEqual(at(t0, SESSION_IDLE_MS));
    expect(await validateSessionToken(knex, token, at(t0, SESSION_IDLE_MS - 1000))).not.toBeNull();
    expect(await validateSessionToken(knex, token, at(t0, SESSION_IDLE_MS + SESSION_IDLE_MS))).toBeNull();
    expect(await knex('sessions').where({ id: session.id }).first()).toBeUndefined();
  });

  it('moves the idle clock at most hourly', async () => {
    const { token, session } = await createSession(knex, id, t0);
    const soon = await validateSessionToken(knex, token, at(t0, 30 * 60_000));
    expect(soon?.refreshed).toBe(false);
    expect(new Date((await knex('sessions').where({ id: session.id }).first()).last_active_at)).toEqual(t0);
    const later = await validateSessionToken(knex, token, at(t0, SESSION_REFRESH_MS));
    expect(later?.refreshed).toBe(true);
    expect(later?.session.expiresAt).toEqual(at(t0, SESSION_REFRESH_MS + SESSION_IDLE_MS));
  });

  it('keeps a session used daily alive, but never past 30 days from sign-in', async () => {
    const { token, session } = await createSession(knex, id, t0);
    for (let day = 1; day < 30; day++) {
      expect(await validateSessionToken(knex, token, at(t0, day * DAY_MS)), `day ${day}`).not.toBeNull();
    }
    const nearEnd = await validateSessionToken(knex, token, at(t0, SESSION_ABSOLUTE_MS - HOUR_MS));
    expect(nearEnd?.session.expiresAt).toEqual(at(t0, SESSION_ABSOLUTE_MS));
    expect(await validateSessionToken(knex, token, at(t0, SESSION_ABSOLUTE_MS))).toBeNull();
    expect(await knex('sessions').where({ id: session.id }).first()).toBeUndefined();
  });

  it('the app refuses an idle-expired session and clears the cookie', async () => {
    const { token, cookie } = await signIn(email, PASSWORD);
    const eightDaysAgo = new Date(Date.now() - 8 * DAY_MS);
    await knex('sessions')
      .where({ id: token.split('.')[0] })
      .update({ last_active_at: eightDaysAgo, created_at: eightDaysAgo });
    const res = await request(appUrl()).get('/api/auth/me').set('Cookie', cookie);
    expect(res.status).toBe(401);
    expect(String(res.headers['set-cookie'])).toMatch(/stallpoint_session=;.*Max-Age=0/);
  });

  it('the app refuses a session past its absolute lifetime even when recently used', async () => {
    const { token, cookie } = await signIn(email, PASSWORD);
    await knex('sessions')
      .where({ id: token.split('.')[0] })
      .update({ created_at: new Date(Date.now() - 31 * DAY_MS), last_active_at: new Date() });
    expect(await meStatus(cookie)).toBe(401);
  });
});

describe('sign-out', () => {
  it('ends this session only (ASVS 5.0 V7.4.1)', async () => {
    const a = await signIn(email, PASSWORD);
    const b = await signIn(email, PASSWORD);
    const res = await postJson('/api/auth/signout', {}, a.cookie);
    expect(res.status).toBe(200);
    expect(String(res.headers['set-cookie'])).toMatch(/Max-Age=0/);
    expect(
      await knex('sessions')
        .where({ id: a.token.split('.')[0] })
        .first(),
    ).toBeUndefined();
    expect(await meStatus(a.cookie)).toBe(401);
    expect(await meStatus(b.cookie)).toBe(200);
  });

  it('from the header form (same origin) redirects to the sign-in page; a cross-site form is refused', async () => {
    const a = await signIn(email, PASSWORD);
    const same = await request(appUrl())
      .post('/api/auth/signout')
      .set('Cookie', a.cookie)
      .set('Origin', appUrl())
      .type('form')
      .send('')
      .redirects(0);
    expect(same.status).toBe(303);
    expect(same.headers.location).toBe('/signin?signedOut=1');
    const b = await signIn(email, PASSWORD);
    const cross = await request(appUrl())
      .post('/api/auth/signout')
      .set('Cookie', b.cookie)
      .set('Origin', 'https://elsewhere.example')
      .type('form')
      .send('');
    expect(cross.status).toBe(403);
    expect(await meStatus(b.cookie)).toBe(200);
  });

  it('everywhere ends every session of the person (ASVS 5.0 V7.4.3)', async () => {
    const a = await signIn(email, PASSWORD);
    const b = await signIn(email, PASSWORD);
    const res = await postJson('/api/auth/signout-everywhere', {}, a.cookie);
    expect(res.status).toBe(200);
    expect(res.body.sessionsEnded).toBeGreaterThanOrEqual(2);
    expect(await meStatus(a.cookie)).toBe(401);
    expect(await meStatus(b.cookie)).toBe(401);
    expect(Number((await knex('sessions').where({ user_id: id }).count({ n: '*' }))[0].n)).toBe(0);
  });

  it('a new sign-in replaces the session the browser had (ASVS 5.0 V7.2.4)', async () => {
    const a = await signIn(email, PASSWORD);
    const res = await postJson('/api/auth/signin', { email, password: PASSWORD }, a.cookie);
    expect(res.status).toBe(200);
    expect(await meStatus(a.cookie)).toBe(401);
  });

  it('invalidateUserSessions is what sign-out everywhere, password change and deactivation share', async () => {
    await createSession(knex, id);
    await createSession(knex, id);
    expect(await invalidateUserSessions(knex, id)).toBeGreaterThanOrEqual(2);
  });
});
