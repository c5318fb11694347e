/**
 * Password reset and invite acceptance check the link first: a bad token is refused as "token" before the
 * new password is looked at (so before any hashing), and link uses are limited per client address and
 * per token in MariaDB (429 with Retry-After). OWASP ASVS 5.0 V2.4.1 (anti-automation), V6.4.1 (links).
 */
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { appDb } from '../helpers/stack.ts';
import { issueToken } from '../../src/server/repos/account-tokens.ts';
import { TOKEN_ADDRESS_LIMIT, TOKEN_USE_LIMIT, tokenUseBucket } from '../../src/server/services/people-accounts.ts';
import { createPerson, postJson, uniqueEmail } from './auth-helpers.ts';

const knex = appDb();
const PASSWORD = 'a long test passphrase for links';
/** Well formed (52 base-32 letters) but issued to nobody. */
const unknownToken = (i: number): string =>
  String(i)
    .replace(/\d/g, (d) => 'bcdefghijk'[Number(d)])
    .padStart(52, 'a');
let userId = 0;

beforeAll(async () => {
  userId = await createPerson(knex, { email: uniqueEmail('links'), password: PASSWORD, roles: ['buyer'] });
});
afterEach(async () => {
  await knex('rate_limit_buckets').where('bucket_key', 'like', 'token:%').delete();
});
afterAll(async () => {
  await knex('users').where({ id: userId }).delete();
  await knex.destroy();
});

describe('the token is checked before the password', () => {
  it.each(['/api/auth/reset', '/api/auth/invite-accept'])(
    '%s: a bad token with a too-short password answers 400 naming "token"',
    async (path) => {
      const res = await postJson(path, { token: unknownToken(1), password: 'short' });
      expect(res.status).toBe(400);
      expect(res.body.issues.map((i: { path: string }) => i.path)).toEqual(['token']);
    },
  );

  it('a valid reset token with a too-short password answers 400 naming "password", and the link still works after', async () => {
    const token = await issueToken(knex, { userId, purpose: 'reset', createdBy: null });
    const short = await postJson('/api/auth/reset', { token, password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.issues[0].path).toBe('password');
    const ok = await postJson('/api/auth/reset', { token, password: 'the next long test passphrase' });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
  });
});

describe('link uses are rate limited', () => {
  it(`per client address: after ${TOKEN_ADDRESS_LIMIT.limit} tries (any tokens, both routes) → 429 with Retry-After`, async () => {
    for (let i = 0; i < TOKEN_ADDRESS_LIMIT.limit; i++) {
      const res = await postJson(i % 2 ? '/api/auth/reset' : '/api/auth/invite-accept', { token: unknownToken(i), password: PASSWORD });
      expect(res.status, `try ${i + 1}`).toBe(400);
    }
    const limited = await postJson('/api/auth/reset', { token: unknownToken(999), password: PASSWORD });
    expect(limited.status).toBe(429);
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    expect(Number(limited.headers['retry-after'])).toBeLessThanOrEqual(TOKEN_ADDRESS_LIMIT.windowSeconds);
    expect(limited.body.issues[0].path).toBe('token');
  });

  it(`per token: after ${TOKEN_USE_LIMIT.limit} uses of one link → 429, even a right password; another link still answers`, async () => {
    const token = await issueToken(knex, { userId, purpose: 'reset', createdBy: null });
    for (let i = 0; i < TOKEN_USE_LIMIT.limit; i++)
      expect((await postJson('/api/auth/reset', { token, password: 'short' })).status).toBe(400);
    const limited = await postJson('/api/auth/reset', { token, password: 'a perfectly good long passphrase' });
    expect(limited.status).toBe(429);
    expect(limited.headers['retry-after']).toMatch(/^\d+$/);
    const bucket = await knex('rate_limit_buckets')
      .where({ bucket_key: tokenUseBucket(token) })
      .first();
    expect(Number(bucket.hits)).toBe(TOKEN_USE_LIMIT.limit + 1);
    expect(bucket.bucket_key).not.toContain(token); // only the token's hash names the bucket
    expect((await postJson('/api/auth/reset', { token: unknownToken(2), password: PASSWORD })).status).toBe(400);
  });
});
