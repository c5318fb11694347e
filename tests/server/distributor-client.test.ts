/**
 * The distributor client against the local fake distributor (scripts/stack/distributor-fake.ts, started
 * here on a free loopback port), in each of the fake's modes. Counts and waits are read from the fake's
 * own request log (its timestamps), never from timers in the test. Expectations: Retry-After semantics
 * from RFC 9110 §10.2.3; retry on 429/5xx only and a bounded number of attempts are common practice; the
 * partial answer's broken offers are every third one, as the fake's header comment states.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { fetchOffers, DistributorError, type ClientOptions } from '../../src/server/distributor/client.ts';
import {
  FAKE_DISTRIBUTOR_NAME,
  fakeOffer,
  startFakeDistributor,
  type FakeDistributor,
  type FakeLogEntry,
} from '../../scripts/stack/distributor-fake.ts';

// Demo part numbers (db/seeds/data): two MOSFETs and a driver the fake carries, and one nobody makes.
const CARRIED = ['MQN12T01-S32', 'MQN20T02-S32', 'PLR2NT30-SO8'];
const UNKNOWN = 'NO-SUCH-PART-1';

let fake: FakeDistributor;
let options: ClientOptions;

async function control(body: Record<string, unknown>): Promise<void> {
  const res = await fetch(`${fake.url}/control`, { method: 'POST', body: JSON.stringify(body) });
  expect(res.status).toBe(200);
}
async function requestLog(): Promise<FakeLogEntry[]> {
  return ((await (await fetch(`${fake.url}/control/log`)).json()) as { requests: FakeLogEntry[] }).requests;
}
async function failure(p: Promise<unknown>): Promise<DistributorError> {
  const err = await p.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(DistributorError);
  return err as DistributorError;
}

beforeAll(async () => {
  fake = await startFakeDistributor(0);
});
afterAll(() => fake.close());
beforeEach(async () => {
  await fetch(`${fake.url}/control/reset`, { method: 'POST' });
  options = { baseUrl: fake.url, timeoutMs: 1_000, retries: 3, baseDelayMs: 20, maxDelayMs: 100, retryAfterCapMs: 3_000 };
});

describe('normal', () => {
  it('returns the offers the fake carries, and none for a part it does not know, in one request', async () => {
    const result = await fetchOffers([...CARRIED, UNKNOWN], options);
    expect(result.distributor).toBe(FAKE_DISTRIBUTOR_NAME);
    expect(result.rejected).toEqual([]);
    expect(result.attempts).toBe(1);
    const carried = CARRIED.filter((m) => fakeOffer(m, Date.now()) !== null);
    expect(carried.length).toBeGreaterThan(0);
    expect(result.offers.map((o) => o.mpn).sort()).toEqual(carried.sort());
    for (const o of result.offers) {
      expect(o.sku).toMatch(/^MPC-\d{6}$/);
      expect(o.priceBreaks.length).toBeGreaterThan(0);
      expect(o.priceBreaks[0].qty).toBe(1);
    }
    expect(await requestLog()).toHaveLength(1);
  });
});

describe('slow', () => {
  it('gives up each attempt at the timeout and stops after the bounded retries', async () => {
    await control({ mode: 'slow', delayMs: 5_000 });
    const err = await failure(fetchOffers(CARRIED, { ...options, timeoutMs: 200, retries: 2 }));
    expect(err.kind).toBe('timeout');
    expect(err.attempts).toBe(3);
    const log = await requestLog();
    expect(log).toHaveLength(3);
    // Each attempt was cut at its 200 ms deadline, far short of the 5 s the fake would have taken.
    expect(log[2].at - log[0].at).toBeLessThan(5_000);
  });

  it('succeeds when only the first answer is slow', async () => {
    await control({ mode: 'slow', delayMs: 5_000, times: 1 });
    const result = await fetchOffers(CARRIED, { ...options, timeoutMs: 200 });
    expect(result.attempts).toBe(2);
    expect(result.offers.length).toBeGreaterThan(0);
  });
});

describe('429 with Retry-After', () => {
  it('waits the seconds the fake asks for before each retry, then succeeds', async () => {
    await control({ mode: '429', retryAfter: 1, times: 2 });
    const result = await fetchOffers(CARRIED, options);
    expect(result.attempts).toBe(3);
    const log = await requestLog();
    expect(log.map((e) => e.status)).toEqual([429, 429, 200]);
    // Retry-After: 1 → at least 1000 ms between an answer and the next request (the backoff alone would be ≤ 100 ms).
    expect(log[1].at - log[0].at).toBeGreaterThanOrEqual(1_000);
    expect(log[2].at - log[1].at).toBeGreaterThanOrEqual(1_000);
  });

  it('honours an HTTP-date', async () => {
    const until = new Date(Date.now() + 2_000);
    await control({ mode: '429', retryAfter: until.toUTCString(), times: 1 });
    await fetchOffers(CARRIED, options);
    const log = await requestLog();
    expect(log.map((e) => e.status)).toEqual([429, 200]);
    // The date has whole seconds: the retry comes no earlier than that second began.
    expect(log[1].at).toBeGreaterThanOrEqual(Math.floor(until.getTime() / 1000) * 1000 - 1_000);
    expect(log[1].at - log[0].at).toBeGreaterThanOrEqual(900);
  });

  it('caps a long Retry-After at retryAfterCapMs', async () => {
    await control({ mode: '429', retryAfter: 3_600, times: 1 });
    await fetchOffers(CARRIED, { ...options, retryAfterCapMs: 1_200 });
    const log = await requestLog();
    const gap = log[1].at - log[0].at;
    expect(gap).toBeGreaterThanOrEqual(1_200);
    expect(gap).toBeLessThan(3_600_000);
  });

  it('stops after the bounded retries when the fake keeps refusing', async () => {
    await control({ mode: '429', retryAfter: 0 });
    const err = await failure(fetchOffers(CARRIED, { ...options, retries: 2 }));
    expect([err.kind, err.status, err.attempts]).toEqual(['http', 429, 3]);
    expect(await requestLog()).toHaveLength(3);
  });
});

describe('500', () => {
  it('retries with backoff a bounded number of times, then fails naming the status', async () => {
    await control({ mode: '500' });
    const err = await failure(fetchOffers(CARRIED, options));
    expect([err.kind, err.status, err.attempts]).toEqual(['http', 500, 4]);
    expect(err.message).toContain('500');
    expect(await requestLog()).toHaveLength(4); // 1 + retries (3)
  });

  it('recovers when the errors stop', async () => {
    await control({ mode: '500', times: 2 });
    const result = await fetchOffers(CARRIED, options);
    expect(result.attempts).toBe(3);
    expect((await requestLog()).map((e) => e.status)).toEqual([500, 500, 200]);
  });
});

describe('other 4xx', () => {
  it('does not retry a 404', async () => {
    await control({ mode: '404' });
    const err = await failure(fetchOffers(CARRIED, options));
    expect([err.kind, err.status, err.attempts]).toEqual(['http', 404, 1]);
    expect(await requestLog()).toHaveLength(1);
  });
});

describe('malformed', () => {
  it('fails at once on a body that is not JSON', async () => {
    await control({ mode: 'malformed' });
    const err = await failure(fetchOffers(CARRIED, options));
    expect([err.kind, err.attempts]).toEqual(['malformed', 1]);
    expect(await requestLog()).toHaveLength(1);
  });
});

describe('partial', () => {
  it('keeps the valid offers and names the broken ones', async () => {
    await control({ mode: 'partial' });
    const result = await fetchOffers(CARRIED, options);
    const carried = CARRIED.filter((m) => fakeOffer(m, Date.now()) !== null);
    // Every third offer (index 0, 3, …) is broken: stock "plenty", price breaks "call us".
    const broken = carried.filter((_, i) => i % 3 === 0);
    expect(result.rejected.map((r) => r.mpn)).toEqual(broken);
    expect(result.rejected[0].problems.join(' ')).toMatch(/stock/);
    expect(result.rejected[0].problems.join(' ')).toMatch(/priceBreaks/);
    expect(result.offers.map((o) => o.mpn)).toEqual(carried.filter((_, i) => i % 3 !== 0));
  });
});
