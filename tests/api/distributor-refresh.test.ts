/**
 * The distributor offers cache and its refresh (issue 13 item 3), against the real MariaDB and the local
 * fake distributor: a fake of this file's own (fixed clock, so its figures hold still) for the refresh
 * itself, and the stack's fake (DISTRIBUTOR_URL) for the app's endpoint and pages. Expected figures are
 * read from the fake's raw JSON with a plain fetch (not through the client under test); counts of
 * requests from the fake's request log. Keeping the last good figure on a failed fetch and one refresher
 * at a time under a lock are the behaviours issue 13 asks for.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';
import { startFakeDistributor, type FakeDistributor, type FakeLogEntry, type FakeOffer } from '../../scripts/stack/distributor-fake.ts';
import { refreshOffers } from '../../src/server/distributor/refresh.ts';
import type { ClientOptions } from '../../src/server/distributor/client.ts';
import { listPartOffers, refreshState } from '../../src/server/repos/distributor-offers.ts';

const knex = appDb();
const FIXED = Date.UTC(2026, 11, 3, 9, 0, 0);
let fake: FakeDistributor;
let client: ClientOptions;

async function control(url: string, body: Record<string, unknown>): Promise<void> {
  expect((await fetch(`${url}/control`, { method: 'POST', body: JSON.stringify(body) })).status).toBe(200);
}
async function requestLog(url: string): Promise<FakeLogEntry[]> {
  return ((await (await fetch(`${url}/control/log`)).json()) as { requests: FakeLogEntry[] }).requests;
}
/** What the fake serves for these part numbers, read raw. */
async function served(url: string, mpns: string[]): Promise<unknown[]> {
  const u = new URL('/v1/offers', url);
  for (const m of mpns) u.searchParams.append('mpn', m);
  return ((await (await fetch(u)).json()) as { offers: unknown[] }).offers;
}
async function approvedMpns(): Promise<string[]> {
  return [...new Set((await knex('parts').where({ review_status: 'approved' }).orderBy('id').pluck('mpn')) as string[])];
}
async function cacheRows(): Promise<
  { part_id: number; sku: string; stock_qty: number; price_breaks: unknown; fetched_at: Date; last_error: string | null }[]
> {
  return knex('distributor_offers').select('part_id', 'sku', 'stock_qty', 'price_breaks', 'fetched_at', 'last_error').orderBy('part_id');
}

beforeAll(async () => {
  fake = await startFakeDistributor(0, { clock: () => FIXED });
  client = { baseUrl: fake.url, timeoutMs: 500, retries: 1, baseDelayMs: 1, maxDelayMs: 5, retryAfterCapMs: 50 };
});
afterAll(async () => {
  await fake.close();
  await knex.destroy();
});
beforeEach(async () => {
  await fetch(`${fake.url}/control/reset`, { method: 'POST' });
});

describe('a refresh writes the cache', () => {
  it('stores every offer the fake serves for the approved parts, and reads each back as served', async () => {
    await knex('distributor_offers').del();
    const mpns = await approvedMpns();
    const raw = (await served(fake.url, mpns)) as FakeOffer[];
    expect(raw.length).toBeGreaterThan(10);
    await fetch(`${fake.url}/control/reset`, { method: 'POST' });

    const outcome = await refreshOffers({ db: knex, client });
    expect(outcome).toMatchObject({ ran: true, failedBatches: 0, offersRejected: 0, errors: [] });
    expect(outcome.batches).toBe(Math.ceil(new Set(mpns).size / 50));
    expect(await requestLog(fake.url)).toHaveLength(outcome.batches);
    expect(outcome.offersWritten).toBe((await cacheRows()).length);

    for (const offer of raw.slice(0, 5)) {
      const partId = (await knex('parts').where({ mpn: offer.mpn, review_status: 'approved' }).first('id')).id as number;
      const [cached] = await listPartOffers(knex, partId);
      expect(cached).toMatchObject({
        mpn: offer.mpn,
        distributor: 'Marlpit Components',
        sku: offer.sku,
        stockQty: offer.stock,
        moq: offer.moq,
        currency: offer.currency,
        priceBreaks: offer.priceBreaks,
        leadTimeDays: offer.leadTimeDays,
        lastError: null,
      });
    }
    const state = await refreshState(knex);
    expect(state).toMatchObject({ holder: null, lockedUntil: null, lastOk: true });
    expect(state.lastOutcome).toContain(`${outcome.offersWritten} offers written`);
  });
});

describe('a failed refresh keeps the cached figures and records the error', () => {
  it.each([
    ['500', { mode: '500' }, /answered 500 \(2 attempts\)/, 2],
    ['429', { mode: '429', retryAfter: 0 }, /answered 429 \(2 attempts\)/, 2],
    ['slow', { mode: 'slow', delayMs: 3_000 }, /no answer within 500 ms \(2 attempts\)/, 2],
    ['malformed', { mode: 'malformed' }, /not JSON/, 1],
    ['404', { mode: '404' }, /answered 404/, 1],
  ])('%s', async (_name, mode, error, attemptsPerBatch) => {
    await refreshOffers({ db: knex, client }); // a good refresh first
    const before = await cacheRows();
    expect(before.length).toBeGreaterThan(10);
    await fetch(`${fake.url}/control/reset`, { method: 'POST' });
    await control(fake.url, mode);

    const outcome = await refreshOffers({ db: knex, client, log: () => {} });
    expect(outcome.ran).toBe(true);
    expect(outcome.failedBatches).toBe(outcome.batches);
    expect(outcome.offersWritten).toBe(0);
    // Retries bounded: 1 + retries (1) attempts per batch for a retryable failure, 1 otherwise.
    expect(await requestLog(fake.url)).toHaveLength(outcome.batches * attemptsPerBatch);

    const after = await cacheRows();
    expect(after.map(({ last_error: _e, ...figures }) => figures)).toEqual(before.map(({ last_error: _e, ...figures }) => figures));
    for (const row of after) expect(row.last_error).toMatch(error);
    const state = await refreshState(knex);
    expect(state.lastOk).toBe(false);
    expect(state.lastOutcome).toMatch(error);
  });

  it('partial: writes the valid offers and marks the broken ones, keeping their old figures', async () => {
    await refreshOffers({ db: knex, client });
    const before = new Map((await cacheRows()).map((r) => [r.part_id, r]));
    await control(fake.url, { mode: 'partial' });
    const mpns = await approvedMpns();
    // Which offers the fake breaks: those it serves with stock "plenty" (read raw, batch by batch as the refresh asks).
    const broken = new Set<string>();
    for (let i = 0; i < mpns.length; i += 50)
      for (const o of (await served(fake.url, mpns.slice(i, i + 50))) as { mpn: string; stock: unknown }[])
        if (o.stock === 'plenty') broken.add(o.mpn);
    expect(broken.size).toBeGreaterThan(0);

    const outcome = await refreshOffers({ db: knex, client, log: () => {} });
    expect(outcome.offersRejected).toBe(broken.size);
    expect(outcome.failedBatches).toBe(0);
    const rows = await knex('distributor_offers as o').join('parts as p', 'p.id', 'o.part_id').select('o.*', 'p.mpn as part_mpn');
    for (const row of rows) {
      const old = before.get(row.part_id)!;
      if (broken.has(row.part_mpn)) {
        expect(row.last_error).toMatch(/offer failed validation: .*stock/);
        expect(row.fetched_at).toEqual(old.fetched_at);
        expect(row.stock_qty).toBe(old.stock_qty);
      } else {
        expect(row.last_error).toBeNull();
        expect(row.fetched_at.getTime()).toBeGreaterThan(old.fetched_at.getTime());
      }
    }
  });
});

describe('the refresh lock', () => {
  it('lets one of two concurrent refreshes do the work', async () => {
    await control(fake.url, { mode: 'slow', delayMs: 300 });
    const outcomes = await Promise.all([
      refreshOffers({ db: knex, client: { ...client, timeoutMs: 5_000 } }),
      refreshOffers({ db: knex, client: { ...client, timeoutMs: 5_000 } }),
    ]);
    expect(outcomes.map((o) => o.ran).sort()).toEqual([false, true]);
    const worker = outcomes.find((o) => o.ran)!;
    expect(worker.failedBatches).toBe(0);
    expect(outcomes.find((o) => !o.ran)!.batches).toBe(0);
    // Only one server's requests reached the distributor.
    expect(await requestLog(fake.url)).toHaveLength(worker.batches);
    expect((await refreshState(knex)).holder).toBeNull();
  });

  it('waits for a lock another server holds, and takes over one whose holder died (expired)', async () => {
    await knex('distributor_refresh')
      .where({ job: 'offers' })
      .update({ holder: 'other-server', locked_until: knex.raw('NOW(3) + INTERVAL 60 SECOND') });
    expect((await refreshOffers({ db: knex, client })).ran).toBe(false);
    expect(await requestLog(fake.url)).toHaveLength(0);
    await knex('distributor_refresh')
      .where({ job: 'offers' })
      .update({ holder: 'dead-server', locked_until: knex.raw('NOW(3) - INTERVAL 1 SECOND') });
    expect((await refreshOffers({ db: knex, client })).ran).toBe(true);
    expect((await refreshState(knex)).holder).toBeNull();
  });
});

describe('the app: refresh now and the part page', () => {
  const stackFake = (): string => process.env.DISTRIBUTOR_URL!;
  let buyer = '';
  let librarian = '';
  let designer = '';
  beforeAll(async () => {
    expect(stackFake()).toMatch(/^http:\/\/127\.0\.0\.1:\d+$/);
    [buyer, librarian, designer] = await Promise.all([sessionCookie('buyer'), sessionCookie('librarian'), sessionCookie('designer')]);
  });
  beforeEach(async () => {
    await fetch(`${stackFake()}/control/reset`, { method: 'POST' });
  });
  const refresh = (cookie: string, body: unknown = {}) =>
    request(appUrl())
      .post('/api/distributor/refresh')
      .set('Cookie', cookie)
      .set('Origin', appUrl())
      .send(body as object);

  it('refuses a body with fields it does not take, naming the field', async () => {
    const res = await refresh(buyer, { everything: true });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.issues)).toContain('everything');
  });

  it('refreshes for a buyer and shows the figure with its age on the part page', async () => {
    const res = await refresh(buyer);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ ran: true, failedBatches: 0 });
    expect(res.body.offersWritten).toBeGreaterThan(10);
    const row = await knex('distributor_offers').orderBy('part_id').first();
    // Thousands separated by commas (common practice), written here with Intl as a second method.
    const stock = new Intl.NumberFormat('en-US').format(row.stock_qty);
    const page = await request(appUrl()).get(`/parts/${row.part_id}`).set('Cookie', librarian);
    expect(page.status).toBe(200);
    expect(page.text).toContain('data-testid="distributor-offers"');
    expect(page.text).toMatch(new RegExp(`stock ${stock} · fetched (just now|1 min ago)`));
    expect(page.text).toContain(row.sku);
    const asDesigner = await request(appUrl()).get(`/parts/${row.part_id}`).set('Cookie', designer);
    expect(asDesigner.status).toBe(200);
    expect(asDesigner.text).not.toContain('data-testid="distributor-offers"');
  });

  it('answers the part page from the cache while a refresh waits on a stalled distributor, which finishes once it answers again', async () => {
    await refresh(buyer);
    const row = await knex('distributor_offers').orderBy('part_id').first();
    await control(stackFake(), { mode: 'slow', delayMs: 60_000 });
    let refreshDone = false;
    const pending = refresh(buyer).then((r) => {
      refreshDone = true;
      return r;
    });
    // Wait until the stalled request has reached the fake, then open the page.
    for (let i = 0; i < 200 && (await requestLog(stackFake())).length === 0; i++) await new Promise((r) => setTimeout(r, 25));
    const page = await request(appUrl()).get(`/parts/${row.part_id}`).set('Cookie', buyer);
    expect(page.status).toBe(200);
    expect(page.text).toContain(row.sku);
    expect(page.text).toMatch(/stock [\d,]+ · fetched/);
    expect(refreshDone).toBe(false); // the page did not wait for the distributor
    await fetch(`${stackFake()}/control/reset`, { method: 'POST' });
    const res = await pending;
    expect(res.status).toBe(200);
  }, 90_000);
});
