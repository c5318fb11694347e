/**
 * The cached distributor figures on the buyer's shortlist (issue 13 items 1 and 3): the demo fan (ready,
 * 500 boards per build) gets offers written straight into the offers cache, so every figure below follows
 * from these rows alone. Default attrition 2 % (README "Configuration"): need = ceil(1 × 500 × 1.02) = 510.
 * Rules (common practice): order at least the MOQ; the unit price is the highest break at or below the
 * order; money to the cent. Ages through the units formatter's coarse steps ("3 h ago", "12 min ago").
 * Then the ordering check: with the stack's fake distributor stalled, the shortlist and the part page
 * answer from the cache, and the fake has answered nothing by then (its request log and answer count).
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';
import type { FakeLog } from '../../scripts/stack/distributor-fake.ts';

const knex = appDb();
const api = () => request(appUrl());
const fake = (): string => process.env.DISTRIBUTOR_URL!;
let buyer = '';
let designer = '';
let fanId = 0;
const part: Record<string, number> = {};
const MIN = 60_000;
let fetchedSwitch = new Date();
let fetchedDiode = new Date();
let checkedDiode = new Date();

async function fakeLog(): Promise<FakeLog> {
  return (await (await fetch(`${fake()}/control/log`)).json()) as FakeLog;
}
async function control(body: Record<string, unknown>): Promise<void> {
  expect((await fetch(`${fake()}/control`, { method: 'POST', body: JSON.stringify(body) })).status).toBe(200);
}

beforeAll(async () => {
  [buyer, designer] = await Promise.all([sessionCookie('buyer'), sessionCookie('designer')]);
  fanId = (await knex('designs').where({ name: 'BF-12 bench fan, 12 V, on/off from 3.3 V logic' }).first('id')).id;
  const picks: { role: string; part_id: number }[] = await knex('design_parts').where({ design_id: fanId, position: 0 });
  for (const p of picks) part[p.role] = p.part_id;
  const now = Date.now();
  // Fetched 3 h 5 min ago: "fetched 3 h ago". The diode's figure is 26 h old and its last fetch failed 12 min ago.
  fetchedSwitch = new Date(now - 185 * MIN);
  fetchedDiode = new Date(now - 26 * 60 * MIN - 5 * MIN);
  checkedDiode = new Date(now - 12 * MIN - 20_000);
  await knex('distributor_offers').del();
  await knex('distributor_offers').insert([
    {
      part_id: part.switch,
      mpn: 'as-cached',
      distributor: 'Marlpit Components',
      sku: 'MPC-T1',
      stock_qty: 300,
      moq: 10,
      currency: 'EUR',
      price_breaks: JSON.stringify([
        { qty: 1, unitPrice: 0.31 },
        { qty: 100, unitPrice: 0.25 },
        { qty: 1000, unitPrice: 0.19 },
      ]),
      lead_time_days: 2,
      fetched_at: fetchedSwitch,
      checked_at: fetchedSwitch,
      last_error: null,
    },
    {
      part_id: part.diode,
      mpn: 'as-cached',
      distributor: 'Marlpit Components',
      sku: 'MPC-T2',
      stock_qty: 5000,
      moq: 1,
      currency: 'USD',
      price_breaks: JSON.stringify([
        { qty: 1, unitPrice: 0.12 },
        { qty: 500, unitPrice: 0.09 },
      ]),
      lead_time_days: null,
      fetched_at: fetchedDiode,
      checked_at: checkedDiode,
      last_error: 'answered 500 (4 attempts)',
    },
  ]);
});
afterAll(async () => {
  await fetch(`${fake()}/control/reset`, { method: 'POST' });
  await knex.destroy();
});

interface Option {
  partId: number;
  position: number;
  distributorOffers: Record<string, unknown>[];
}
interface Design {
  id: number;
  lines: { key: string; need: number; options: Option[] }[];
  totals: { totalOrg: number };
}
async function fan(cookie: string): Promise<Design> {
  const res = await api().get('/api/shortlist').set('Cookie', cookie);
  expect(res.status, res.text.slice(0, 300)).toBe(200);
  return (res.body.designs as Design[]).find((d) => d.id === fanId)!;
}
const chosenOf = (d: Design, key: string): Option => d.lines.find((l) => l.key === key)!.options.find((o) => o.position === 0)!;

describe('the shortlist JSON carries the cached figures at the need', () => {
  it('has the lines this test caches offers for', () => {
    expect(part.switch && part.diode && part.motor).toBeTruthy();
  });

  it('switch: 510 at the 100 break from the cache, short by 210, with fetchedAt', async () => {
    const d = await fan(buyer);
    expect(d.lines.find((l) => l.key === 'switch')!.need).toBe(510);
    // 510 ≥ MOQ 10 → order 510; break 100 at 0.25 → 127.50 EUR; 510 − 300 = 210 short.
    expect(chosenOf(d, 'switch').distributorOffers).toEqual([
      {
        distributor: 'Marlpit Components',
        sku: 'MPC-T1',
        stockQty: 300,
        moq: 10,
        currency: 'EUR',
        priceBreaks: [
          { qty: 1, unitPrice: 0.31 },
          { qty: 100, unitPrice: 0.25 },
          { qty: 1000, unitPrice: 0.19 },
        ],
        leadTimeDays: 2,
        fetchedAt: fetchedSwitch.toISOString(),
        checkedAt: fetchedSwitch.toISOString(),
        lastError: null,
        stale: false, // 3 h old, no schedule in the test stack: stale after a day
        orderQty: 510,
        breakQty: 100,
        unitPrice: 0.25,
        extendedCost: 127.5,
        shortfall: 210,
      },
    ]);
  });

  it('diode: the failed fetch keeps the figure, with the error and both times', async () => {
    const [o] = chosenOf(await fan(buyer), 'diode').distributorOffers;
    // 510 at the 500 break, 0.09 USD → 45.90 USD; 5000 in stock, enough.
    expect(o).toMatchObject({
      sku: 'MPC-T2',
      orderQty: 510,
      breakQty: 500,
      unitPrice: 0.09,
      extendedCost: 45.9,
      shortfall: 0,
      leadTimeDays: null,
      fetchedAt: fetchedDiode.toISOString(),
      checkedAt: checkedDiode.toISOString(),
      lastError: 'answered 500 (4 attempts)',
      stale: true,
    });
  });

  it('motor: none cached, an empty list', async () => {
    expect(chosenOf(await fan(buyer), 'motor').distributorOffers).toEqual([]);
  });

  it('a designer gets no distributor figures (as on the part page), and the page has no such column', async () => {
    const d = await fan(designer);
    for (const l of d.lines) for (const o of l.options) expect(o.distributorOffers).toEqual([]);
    const page = await api().get('/shortlist').set('Cookie', designer);
    expect(page.status).toBe(200);
    expect(page.text).not.toContain('data-testid="line-offers"');
  });
});

describe('the shortlist page and CSV show them', () => {
  it('says the figure, its age and the failed fetch in words; the motor says none is cached', async () => {
    const res = await api().get('/shortlist').set('Cookie', buyer);
    expect(res.status).toBe(200);
    const row = (key: string): string => {
      const start = res.text.indexOf(`data-line="${key}" data-option="0"`);
      return res.text.slice(start, res.text.indexOf('</tr>', start));
    };
    expect(row('switch')).toContain('Marlpit Components MPC-T1');
    expect(row('switch')).toContain('· fetched 3 h ago');
    expect(row('switch')).toContain('✕ 300 in stock, short by 210 · 0.2500 EUR at 100+ (127.50 EUR for 510) · lead 2 d · MOQ 10');
    expect(row('switch')).not.toContain('line-offer-warning');
    expect(row('diode')).toContain('✓ 5,000 in stock · 0.0900 USD at 500+ (45.90 USD for 510) · lead time not stated');
    expect(row('diode')).toContain('Last fetch failed 12 min ago (answered 500 (4 attempts)); the figure fetched 26 h ago is kept.');
    expect(row('motor')).toContain('— none cached');
  });

  it('writes an offer row after the option in the CSV, with fetched_at and the error', async () => {
    const res = await api().get('/api/shortlist.csv').set('Cookie', buyer);
    expect(res.status).toBe(200);
    const lines = res.text.split('\r\n').filter((l) => l.startsWith(`offer,${fanId},`));
    expect(lines).toHaveLength(2);
    expect(lines[0]).toContain(',MPC-T1,');
    expect(lines[0]).toContain(`,${fetchedSwitch.toISOString()},`);
    expect(lines[1]).toContain(',MPC-T2,');
    expect(lines[1].endsWith(`,${fetchedDiode.toISOString()},answered 500 (4 attempts)`)).toBe(true);
  });
});

describe('a stalled distributor never holds the pages up', () => {
  beforeEach(async () => {
    await fetch(`${fake()}/control/reset`, { method: 'POST' });
  });
  const pages = (): Promise<request.Response[]> =>
    Promise.all([api().get('/shortlist').set('Cookie', buyer), api().get(`/parts/${part.switch}`).set('Cookie', buyer)]);

  it('the pages ask the distributor nothing: with the fake stalled they answer and its log stays empty', async () => {
    await control({ mode: 'slow', delayMs: 60_000 });
    const [shortlist, partPage] = await pages();
    expect([shortlist.status, partPage.status]).toEqual([200, 200]);
    expect(shortlist.text).toContain('· fetched 3 h ago');
    expect(partPage.text).toContain('stock 300 · fetched 3 h ago');
    expect(await fakeLog()).toMatchObject({ requests: [], pending: 0, answered: 0 });
  });

  it('while a refresh waits on the stalled fake, both pages answer with the cached figure before the fake answers', async () => {
    await control({ mode: 'slow', delayMs: 60_000 });
    const refresh = api().post('/api/distributor/refresh').set('Cookie', buyer).set('Origin', appUrl()).send({});
    const refreshDone = refresh.then((r) => r); // starts it
    // Probe: the refresh's request has reached the fake and is held there unanswered.
    for (let i = 0; i < 400 && (await fakeLog()).pending === 0; i++) await new Promise((r) => setTimeout(r, 25));
    expect((await fakeLog()).pending).toBeGreaterThan(0);

    const [shortlist, partPage] = await pages();
    const log = await fakeLog();
    expect([shortlist.status, partPage.status]).toEqual([200, 200]);
    expect(shortlist.text).toContain('Marlpit Components MPC-T1');
    expect(shortlist.text).toMatch(/· fetched 3 h ago/);
    expect(partPage.text).toMatch(/stock 300 · fetched 3 h ago/);
    // Ordering, not timing: the fake had sent no answer when both pages had answered.
    expect(log.answered).toBe(0);
    expect(log.requests.length).toBeGreaterThan(0);
    expect(log.requests.every((r) => r.mode === 'slow')).toBe(true);

    await fetch(`${fake()}/control/reset`, { method: 'POST' });
    expect((await refreshDone).status).toBe(200);
  }, 90_000);
});
