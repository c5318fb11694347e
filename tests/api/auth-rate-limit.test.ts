/**
 * The generic MariaDB-counted limiter, and sign-in limited per account and per client address:
 * the limit is reached (429 with Retry-After) and lifted when the window has passed.
 * OWASP ASVS 5.0 V6.3.1 (brute force and credential stuffing), V2.4.1 (anti-automation).
 */
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { appDb } from '../helpers/stack.ts';
import { consume, pruneBuckets, refund, reset } from '../../src/server/repos/rate-limit.ts';
import { accountBucket, addressBucket, SIGNIN_ACCOUNT_LIMIT, SIGNIN_ADDRESS_LIMIT } from '../../src/server/auth/signin.ts';
import { createPerson, postJson, uniqueEmail } from './auth-helpers.ts';

const knex = appDb();
const PASSWORD = 'a long test passphrase for limits';
let email: string;
let id: number;
beforeAll(async () => {
  email = uniqueEmail('limits');
  id = await createPerson(knex, { email, password: PASSWORD, roles: ['buyer'] });
});
afterEach(async () => {
  // Sign-ins in the other test files all come from 127.0.0.1: leave the address bucket empty.
  await knex('rate_limit_buckets').where('bucket_key', 'like', 'signin:%').delete();
});
afterAll(async () => {
  await knex('users').where({ id }).delete();
  await knex.destroy();
});

/** Moves a bucket's window into the past, as if its time had run out. */
async function windowPassed(bucketKey: string, seconds: number): Promise<void> {
  await knex('rate_limit_buckets')
    .where({ bucket_key: bucketKey })
    .update({ window_started_at: new Date(Date.now() - seconds * 1000 - 1000) });
}

describe('consume() with a controllable clock', () => {
  const t0 = new Date('2027-05-01T10:00:00.000Z');
  const rule = { limit: 3, windowSeconds: 60 };

  it('allows `limit` hits per window, then refuses with the seconds left, then allows again', async () => {
    const key = `test:${uniqueEmail('bucket')}`;
    for (let i = 1; i <= 3; i++) expect((await consume(knex, key, rule, new Date(t0.getTime() + i * 1000))).allowed).toBe(true);
    const refused = await consume(knex, key, rule, new Date(t0.getTime() + 20_000));
    // The window began with the first hit (t0 + 1 s), so it ends at t0 + 61 s: 41 s after t0 + 20 s.
    expect(refused).toEqual({ allowed: false, hits: 4, remaining: 0, retryAfterSeconds: 41 });
    const lifted = await consume(knex, key, rule, new Date(t0.getTime() + 61_000));
    expect(lifted).toEqual({ allowed: true, hits: 1, remaining: 2, retryAfterSeconds: 0 });
    await reset(knex, key);
  });

  it('refund gives one hit back, reset forgets the bucket, prune drops old windows', async () => {
    const key = `test:${uniqueEmail('bucket')}`;
    await consume(knex, key, rule, t0);
    await consume(knex, key, rule, t0);
    await refund(knex, key);
    expect((await consume(knex, key, rule, t0)).hits).toBe(2);
    await reset(knex, key);
    expect((await consume(knex, key, rule, t0)).hits).toBe(1);
    expect(await pruneBuckets(knex, 3600, new Date(t0.getTime() + 2 * 3600_000))).toBeGreaterThanOrEqual(1);
    expect(await knex('rate_limit_buckets').where({ bucket_key: key }).first()).toBeUndefined();
  });

  it('counts concurrent hits exactly (the upsert is atomic)', async () => {
    const key = `test:${uniqueEmail('bucket')}`;
    const verdicts = await Promise.all(Array.from({ length: 8 }, () => consume(knex, key, rule, t0)));
    expect(verdicts.filter((v) => v.allowed)).toHaveLength(3);
    expect(verdicts.map((v) => v.hits).sort((a, b) => a - b)).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
    await reset(knex, key);
  });
});

describe('sign-in per account', () => {
  it(`after ${SIGNIN_ACCOUNT_LIMIT.limit} failures answers 429 with Retry-After, even for the right password; lifted when the window ends`, async () => {
    for (let i = 0; i < SIGNIN_ACCOUNT_LIMIT.limit; i++) {
      expect((await postJson('/api/auth/signin', { email, password: `wrong guess number ${i}` })).status).toBe(401);
    }
    const limited = await postJson('/api/auth/signin', { email, password: PASSWORD });
    expect(limited.status).toBe(429);
    expect(limited.body).toEqual({ error: expect.stringMatching(/Too many sign-in attempts/), issues: [] });
    const retryAfter = Number(limited.headers['retry-after']);
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(SIGNIN_ACCOUNT_LIMIT.windowSeconds);

    await windowPassed(accountBucket(email), SIGNIN_ACCOUNT_LIMIT.windowSeconds);
    await windowPassed(addressBucket('127.0.0.1'), SIGNIN_ADDRESS_LIMIT.windowSeconds);
    expect((await postJson('/api/auth/signin', { email, password: PASSWORD })).status).toBe(200);
  });

  it('a successful sign-in clears the account’s failures', async () => {
    for (let i = 0; i < 3; i++) await postJson('/api/auth/signin', { email, password: `wrong guess ${i}` });
    expect((await postJson('/api/auth/signin', { email, password: PASSWORD })).status).toBe(200);
    expect(
      await knex('rate_limit_buckets')
        .where({ bucket_key: accountBucket(email) })
        .first(),
    ).toBeUndefined();
  });
});

describe('sign-in per client address', () => {
  it(`after ${SIGNIN_ADDRESS_LIMIT.limit} failures from one address refuses every account from it; lifted when the window ends`, async () => {
    // A different unknown address each time: the per-account limit never trips, only the per-address one.
    for (let i = 0; i < SIGNIN_ADDRESS_LIMIT.limit; i++) {
      expect((await postJson('/api/auth/signin', { email: uniqueEmail('stuffing'), password: 'credential stuffing try' })).status).toBe(
        401,
      );
    }
    const limited = await postJson('/api/auth/signin', { email, password: PASSWORD });
    expect(limited.status).toBe(429);
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    await windowPassed(addressBucket('127.0.0.1'), SIGNIN_ADDRESS_LIMIT.windowSeconds);
    expect((await postJson('/api/auth/signin', { email, password: PASSWORD })).status).toBe(200);
  });
});
