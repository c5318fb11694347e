/**
 * Invitation and password reset end to end: the API sends real SMTP to the local sink (smtp-server,
 * started by npm test), the sink stores the parsed message in MariaDB, the test reads the link from it.
 * Also: password rules, deactivation and password change ending sessions.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { sha256 } from '@oslojs/crypto/sha2';
import { appDb, appUrl } from '../helpers/stack.ts';
import { commonPasswordCount } from '../../src/server/auth/password-rules.ts';
import {
  createPerson,
  demoEmail,
  lastMailId,
  meStatus,
  postJson,
  sessionCookie,
  signIn,
  tokenFrom,
  uniqueEmail,
  waitForMail,
} from './auth-helpers.ts';

const knex = appDb();
let admin: string;
const created: string[] = [];
beforeAll(async () => {
  admin = await sessionCookie(knex, demoEmail('admin'));
});
afterAll(async () => {
  if (created.length) await knex('users').whereIn('email', created).delete();
  await knex('rate_limit_buckets').where('bucket_key', 'like', 'signin:%').delete();
  await knex.destroy();
});

const GOOD_PASSWORD = 'copper winding on a warm bench';
const hashOf = (token: string): Buffer => Buffer.from(sha256(new TextEncoder().encode(token)));

async function invite(
  roles: string[] = ['buyer'],
): Promise<{ email: string; token: string; mail: Awaited<ReturnType<typeof waitForMail>> }> {
  const email = uniqueEmail('invitee');
  created.push(email);
  const before = await lastMailId(knex);
  const res = await postJson('/api/people', { email, name: 'Ivo Invitee', roles }, admin);
  expect(res.status).toBe(201);
  expect(res.body).toMatchObject({ person: { email, name: 'Ivo Invitee', roles, status: 'invited' }, mailSent: true });
  const mail = await waitForMail(knex, email, before);
  return { email, token: tokenFrom(mail.text_body, '/invite'), mail };
}

describe('invitation', () => {
  it('arrives in the sink as plain text and HTML with the product name, a single-use link and no tracking', async () => {
    const { token, mail } = await invite();
    expect(mail.subject).toContain('Stallpoint');
    expect(mail.text_body).toContain('72 hours');
    expect(mail.html_body).toContain(`/invite?token=${token}`);
    expect(mail.html_body).not.toMatch(/<img|utm_|pixel/i);
    // Only the hash of the link's token is stored (ASVS 5.0 V6.4.1).
    const row = await knex('account_tokens')
      .where({ token_hash: hashOf(token) })
      .first();
    expect(row).toMatchObject({ purpose: 'invite', used_at: null });
    expect(JSON.stringify(await knex('account_tokens').select('*'))).not.toContain(token);
    const hours = (new Date(row.expires_at).getTime() - new Date(row.created_at).getTime()) / 3600_000;
    expect(hours).toBe(72);
  });

  it('lets the invitee choose a password, signs them in with their roles, and works only once', async () => {
    const { email, token } = await invite(['designer', 'buyer']);
    const page = await request(appUrl()).get(`/invite?token=${token}`);
    expect(page.status).toBe(200);
    expect(page.text).toContain(email);

    // Password rules (ASVS 5.0 V6.2.1 minimum length, V6.2.4 common passwords refused); the link survives a refusal.
    const short = await postJson('/api/auth/invite-accept', { token, password: 'short pw' });
    expect(short.status).toBe(400);
    expect(short.body.issues[0].path).toBe('password');
    const common = await postJson('/api/auth/invite-accept', { token, password: 'Password1234' });
    expect(common.status).toBe(400);
    expect(common.body.error).toMatch(/most common/);

    const ok = await postJson('/api/auth/invite-accept', { token, password: GOOD_PASSWORD });
    expect(ok.status).toBe(200);
    expect(ok.body.user).toEqual({ email, name: 'Ivo Invitee', roles: ['designer', 'buyer'] });
    const cookie = String(ok.headers['set-cookie']).split(';')[0];
    expect(await meStatus(cookie)).toBe(200);

    const again = await postJson('/api/auth/invite-accept', { token, password: GOOD_PASSWORD });
    expect(again.status).toBe(400);
    expect((await request(appUrl()).get(`/invite?token=${token}`)).status).toBe(410);
    expect((await signIn(email, GOOD_PASSWORD)).status).toBe(200);
  });

  it('resend withdraws the earlier link; an expired link is refused', async () => {
    const { email, token: first } = await invite();
    const id = (await knex('users').where({ email }).first('id')).id;
    const before = await lastMailId(knex);
    const resent = await postJson(`/api/people/${id}/invite`, {}, admin);
    expect(resent.status).toBe(200);
    const second = tokenFrom((await waitForMail(knex, email, before)).text_body, '/invite');
    expect(second).not.toBe(first);
    expect((await postJson('/api/auth/invite-accept', { token: first, password: GOOD_PASSWORD })).status).toBe(400);
    await knex('account_tokens')
      .where({ token_hash: hashOf(second) })
      .update({ expires_at: new Date(Date.now() - 1000) });
    expect((await postJson('/api/auth/invite-accept', { token: second, password: GOOD_PASSWORD })).status).toBe(400);
  });

  it('refuses a second person with the same address (409) and bad fields (400 per field)', async () => {
    const dup = await postJson('/api/people', { email: demoEmail('buyer'), name: 'Someone', roles: ['buyer'] }, admin);
    expect(dup.status).toBe(409);
    const bad = await postJson('/api/people', { email: 'nope', name: '', roles: [] }, admin);
    expect(bad.status).toBe(400);
    expect(bad.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['email', 'name', 'roles']);
  });
});

describe('password reset', () => {
  const PASSWORD = 'the first long test passphrase';

  it('gives the same answer for a known and an unknown address, and mails only the known one (ASVS 5.0 V6.3.8)', async () => {
    const email = uniqueEmail('resetter');
    const unknown = uniqueEmail('unknown');
    created.push(email);
    await createPerson(knex, { email, password: PASSWORD, roles: ['librarian'] });
    const before = await lastMailId(knex);
    const a = await postJson('/api/auth/reset-request', { email: unknown });
    const b = await postJson('/api/auth/reset-request', { email });
    expect(a.status).toBe(202);
    expect(b.status).toBe(202);
    expect(a.body).toEqual(b.body);
    const mail = await waitForMail(knex, email, before);
    expect(mail.subject).toContain('Stallpoint');
    expect(await knex('captured_mail').where('id', '>', before).andWhere('envelope_to', 'like', `%${unknown}%`).first()).toBeUndefined();
  });

  it('sets a new password once, ends every session, and the old password stops working (ASVS 5.0 V6.4.3, V7.4.3)', async () => {
    const email = uniqueEmail('resetter');
    created.push(email);
    await createPerson(knex, { email, password: PASSWORD, roles: ['librarian'] });
    const session = await signIn(email, PASSWORD);
    const before = await lastMailId(knex);
    await postJson('/api/auth/reset-request', { email });
    const mail = await waitForMail(knex, email, before);
    expect(mail.text_body).toContain('30 minutes');
    const token = tokenFrom(mail.text_body, '/reset');
    const row = await knex('account_tokens')
      .where({ token_hash: hashOf(token) })
      .first();
    expect((new Date(row.expires_at).getTime() - new Date(row.created_at).getTime()) / 60_000).toBe(30);

    expect((await request(appUrl()).get(`/reset?token=${token}`)).text).toContain(email);
    const res = await postJson('/api/auth/reset', { token, password: 'the second long test passphrase' });
    expect(res.status).toBe(200);
    expect(await meStatus(session.cookie)).toBe(401);
    expect((await signIn(email, PASSWORD)).status).toBe(401);
    expect((await signIn(email, 'the second long test passphrase')).status).toBe(200);
    expect((await postJson('/api/auth/reset', { token, password: 'a third long test passphrase' })).status).toBe(400);
  });

  it('refuses a reset link after 30 minutes', async () => {
    const email = uniqueEmail('resetter');
    created.push(email);
    await createPerson(knex, { email, password: PASSWORD, roles: ['buyer'] });
    const before = await lastMailId(knex);
    await postJson('/api/auth/reset-request', { email });
    const token = tokenFrom((await waitForMail(knex, email, before)).text_body, '/reset');
    await knex('account_tokens')
      .where({ token_hash: hashOf(token) })
      .update({ created_at: new Date(Date.now() - 31 * 60_000), expires_at: new Date(Date.now() - 60_000) });
    expect((await request(appUrl()).get(`/reset?token=${token}`)).status).toBe(410);
    expect((await postJson('/api/auth/reset', { token, password: 'the second long test passphrase' })).status).toBe(400);
  });
});

describe('password rules', () => {
  it('ship a list of 1,000 common passwords', () => {
    expect(commonPasswordCount()).toBe(1000);
  });

  it('change needs the current password, refuses weak new ones, ends the other sessions and keeps this one', async () => {
    const email = uniqueEmail('changer');
    created.push(email);
    await createPerson(knex, { email, password: 'the old long test passphrase', roles: ['designer'] });
    const here = await signIn(email, 'the old long test passphrase');
    const there = await signIn(email, 'the old long test passphrase');
    const wrong = await postJson('/api/auth/password', { currentPassword: 'not it at all', newPassword: GOOD_PASSWORD }, here.cookie);
    expect(wrong.status).toBe(400);
    expect(wrong.body.issues[0].path).toBe('currentPassword');
    const long = 'x'.repeat(129);
    const tooLong = await postJson(
      '/api/auth/password',
      { currentPassword: 'the old long test passphrase', newPassword: long },
      here.cookie,
    );
    expect(tooLong.status).toBe(400);
    expect(tooLong.body.issues[0].path).toBe('newPassword');
    const res = await postJson(
      '/api/auth/password',
      { currentPassword: 'the old long test passphrase', newPassword: GOOD_PASSWORD },
      here.cookie,
    );
    expect(res.status).toBe(200);
    const fresh = String(res.headers['set-cookie']).split(';')[0];
    expect(await meStatus(there.cookie)).toBe(401);
    expect(await meStatus(here.cookie)).toBe(401);
    expect(await meStatus(fresh)).toBe(200);
    // 128 characters are accepted and not truncated: 127 of them do not sign in (ASVS 5.0 V6.2.8, V6.2.9).
    const max = `${'y'.repeat(127)}z`;
    expect((await postJson('/api/auth/password', { currentPassword: GOOD_PASSWORD, newPassword: max }, fresh)).status).toBe(200);
    expect((await signIn(email, max.slice(0, 127))).status).toBe(401);
    expect((await signIn(email, max)).status).toBe(200);
  });
});

describe('people administration', () => {
  it('deactivation ends the person’s sessions at once and blocks sign-in (ASVS 5.0 V7.4.2)', async () => {
    const email = uniqueEmail('leaver');
    created.push(email);
    const id = await createPerson(knex, { email, password: GOOD_PASSWORD, roles: ['buyer'] });
    const s = await signIn(email, GOOD_PASSWORD);
    expect(await meStatus(s.cookie)).toBe(200);
    const res = await postJson(`/api/people/${id}/deactivate`, {}, admin);
    expect(res.status).toBe(200);
    expect(res.body.person.status).toBe('deactivated');
    expect(await meStatus(s.cookie)).toBe(401);
    expect((await signIn(email, GOOD_PASSWORD)).status).toBe(401);
    expect((await postJson(`/api/people/${id}/reactivate`, {}, admin)).body.person.status).toBe('active');
    expect((await signIn(email, GOOD_PASSWORD)).status).toBe(200);
  });

  it('changing roles takes effect on the next request; an admin cannot drop their own admin role', async () => {
    const email = uniqueEmail('mover');
    created.push(email);
    const id = await createPerson(knex, { email, password: GOOD_PASSWORD, roles: ['buyer'] });
    const s = await signIn(email, GOOD_PASSWORD);
    const res = await request(appUrl())
      .put(`/api/people/${id}/roles`)
      .set('Cookie', admin)
      .set('Content-Type', 'application/json')
      .send({ roles: ['librarian', 'designer'] });
    expect(res.status).toBe(200);
    expect((await request(appUrl()).get('/api/auth/me').set('Cookie', s.cookie)).body.user.roles).toEqual(['librarian', 'designer']);
    const adminId = (
      await knex('users')
        .where({ email: demoEmail('admin') })
        .first('id')
    ).id;
    const self = await request(appUrl())
      .put(`/api/people/${adminId}/roles`)
      .set('Cookie', admin)
      .set('Content-Type', 'application/json')
      .send({ roles: ['buyer'] });
    expect(self.status).toBe(409);
    const people = await request(appUrl()).get('/api/people').set('Cookie', admin);
    expect(people.body.people.find((p: { email: string }) => p.email === email).roles).toEqual(['librarian', 'designer']);
  });

  it('the mail-sink page lists captured mail for admins only', async () => {
    const page = await request(appUrl()).get('/mail').set('Cookie', admin);
    expect(page.status).toBe(200);
    expect(page.text).toContain('data-testid="captured-mail"');
    expect(
      (
        await request(appUrl())
          .get('/mail')
          .set('Cookie', await sessionCookie(knex, demoEmail('librarian')))
      ).status,
    ).toBe(403);
  });
});
