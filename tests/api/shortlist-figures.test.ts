/**
 * The shortlist's buying figures at a build quantity (issue 13 item 1), against tables worked out by hand
 * here. The demo fan (ready, 500 boards per build) gets supply data written straight into the tables, so
 * every figure below follows from these rows alone; default attrition 2 % and organisation currency EUR
 * (README "Configuration"), seeded rates 1 USD = 0.915 EUR and 1 GBP = 1.172 EUR (db/seeds/demo.ts).
 * Rules (common practice): need = ceil(per board × boards × 1.02); order = need raised to the MOQ, then
 * to whole order multiples; unit price = highest break at or below the order; money to the cent, half up.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';
import { readCsvRecords } from '../../src/lib/csv.ts';

const knex = appDb();
const api = () => request(appUrl());
let buyer = '';
let fanId = 0;
const chosen: Record<string, number> = {};

interface SourceRow {
  distributor: string;
  sku: string;
  moq: number;
  order_multiple: number;
  stock_qty: number;
  lead_time_days: number;
  currency: string;
  breaks: [number, number][];
}

async function setSources(partId: number, rows: SourceRow[]): Promise<void> {
  await knex('part_sources').where({ part_id: partId }).del();
  for (const { breaks, ...r } of rows) {
    const [id] = await knex('part_sources').insert({ part_id: partId, ...r });
    await knex('part_price_breaks').insert(breaks.map(([qty, unit_price]) => ({ source_id: id, qty, unit_price })));
  }
}

// Hand-written supply data per line of the fan.
const SWITCH: SourceRow[] = [
  {
    distributor: 'Test Strip Supply',
    sku: 'TSS-1',
    moq: 1,
    order_multiple: 10,
    stock_qty: 200,
    lead_time_days: 5,
    currency: 'EUR',
    breaks: [
      [1, 0.4],
      [100, 0.3],
      [500, 0.25],
    ],
  },
  {
    distributor: 'Test Reel House',
    sku: 'TRH-1',
    moq: 1000,
    order_multiple: 1000,
    stock_qty: 0,
    lead_time_days: 40,
    currency: 'USD',
    breaks: [[1000, 0.2]],
  },
];
const DIODE: SourceRow[] = [
  {
    distributor: 'Test Pound Parts',
    sku: 'TPP-1',
    moq: 100,
    order_multiple: 250,
    stock_qty: 0,
    lead_time_days: 60,
    currency: 'GBP',
    breaks: [
      [100, 0.12],
      [1000, 0.09],
    ],
  },
];
const MOTOR: SourceRow[] = [
  {
    distributor: 'Test Motor Mart',
    sku: 'TMM-1',
    moq: 1,
    order_multiple: 1,
    stock_qty: 1000,
    lead_time_days: 9,
    currency: 'USD',
    breaks: [
      [1, 2.5],
      [250, 2.1],
    ],
  },
];
const DRIVER: SourceRow[] = [
  {
    distributor: 'Test Strip Supply',
    sku: 'TSS-2',
    moq: 1,
    order_multiple: 1,
    stock_qty: 5000,
    lead_time_days: 3,
    currency: 'EUR',
    breaks: [[1, 0.8]],
  },
];

beforeAll(async () => {
  buyer = await sessionCookie('buyer');
  fanId = (await knex('designs').where({ name: 'BF-12 bench fan, 12 V, on/off from 3.3 V logic' }).first('id')).id;
  const picks: { role: string; part_id: number }[] = await knex('design_parts').where({ design_id: fanId, position: 0 });
  for (const p of picks) chosen[p.role] = p.part_id;
  if (chosen.switch) await setSources(chosen.switch, SWITCH);
  if (chosen.diode) await setSources(chosen.diode, DIODE);
  if (chosen.motor) await setSources(chosen.motor, MOTOR);
  if (chosen.driver) await setSources(chosen.driver, DRIVER);
});
afterAll(() => knex.destroy());

interface Quote {
  orderQty: number;
  unitPrice: number | null;
  breakQty: number | null;
  extendedCost: number | null;
  converted: { amount: number; rateToOrg: number; asOf: string | null } | null;
  source: { sku: string; currency: string };
}
interface Option {
  partId: number;
  position: number;
  stockQty: number;
  shortfall: number;
  quote: Quote | null;
  quotes: Quote[];
}
interface Line {
  key: string;
  need: number;
  generic: string | null;
  options: Option[];
}
interface Design {
  id: number;
  boards: number;
  lines: Line[];
  totals: {
    orgCurrency: string;
    totalOrg: number;
    ratesUsed: { currency: string; rateToOrg: number; asOf: string }[];
    unpriced: string[];
    short: string[];
  };
}

async function fan(query = ''): Promise<Design> {
  const res = await api().get(`/api/shortlist${query}`).set('Cookie', buyer);
  expect(res.status, res.text.slice(0, 300)).toBe(200);
  const d = (res.body.designs as Design[]).find((x) => x.id === fanId);
  expect(d, 'the fan is on the shortlist').toBeDefined();
  return d!;
}
const line = (d: Design, key: string): Line => d.lines.find((l) => l.key === key)!;
const pick = (d: Design, key: string): Option => line(d, key).options.find((o) => o.position === 0)!;

describe('shortlist figures at the design quantity (500 boards)', () => {
  it('has the catalogue lines this test priced', () => {
    expect(chosen.switch && chosen.diode && chosen.motor).toBeTruthy();
  });

  it('needs 510 of each one-per-board line: 1 × 500 × 1.02', async () => {
    const d = await fan();
    expect(d.boards).toBe(500);
    for (const l of d.lines) expect([l.key, l.need]).toEqual([l.key, 510]);
  });

  it('switch: cheapest in EUR is the strip source at the 500 break, and 200 in stock is short by 310', async () => {
    const o = pick(await fan(), 'switch');
    // TSS-1: 510 → 51 strips of 10 = 510, break 500 at 0.25 → 127.50 EUR.
    // TRH-1: 510 → MOQ 1000, one reel of 1000, 0.20 USD → 200.00 USD × 0.915 = 183.00 EUR.
    expect(o.quotes.map((q) => [q.source.sku, q.orderQty, q.breakQty, q.unitPrice, q.extendedCost, q.converted?.amount])).toEqual([
      ['TSS-1', 510, 500, 0.25, 127.5, 127.5],
      ['TRH-1', 1000, 1000, 0.2, 200, 183],
    ]);
    expect(o.quote?.source.sku).toBe('TSS-1');
    expect([o.stockQty, o.shortfall]).toEqual([200, 310]); // 200 + 0 in stock; 510 − 200 = 310
  });

  it('diode: MOQ 100 then reels of 250 make 750, priced at the 100 break, converted from GBP', async () => {
    const o = pick(await fan(), 'diode');
    // 510 ≥ MOQ 100; 510 / 250 = 2.04 → 3 reels = 750; break 100 at 0.12 → 90.00 GBP × 1.172 = 105.48 EUR.
    expect(o.quote).toMatchObject({
      orderQty: 750,
      breakQty: 100,
      unitPrice: 0.12,
      extendedCost: 90,
      converted: { amount: 105.48, rateToOrg: 1.172, asOf: '2026-12-01' },
    });
    expect([o.stockQty, o.shortfall]).toEqual([0, 510]);
  });

  it('motor: 510 at the 250 break, converted from USD', async () => {
    const o = pick(await fan(), 'motor');
    // 510 × 2.10 = 1071.00 USD × 0.915 = 979.965 → 979.97 EUR (half up); 1000 in stock, enough.
    expect(o.quote).toMatchObject({ orderQty: 510, breakQty: 250, unitPrice: 2.1, extendedCost: 1071, converted: { amount: 979.97 } });
    expect(o.shortfall).toBe(0);
  });

  it('totals the chosen parts in EUR with the dates of the rates used, and names the short lines', async () => {
    const d = await fan();
    // 127.50 + 105.48 + 979.97 = 1212.95 EUR, plus 510 × 0.80 = 408.00 EUR when the fan has a driver line.
    const expected = chosen.driver ? 1620.95 : 1212.95;
    expect(d.totals.orgCurrency).toBe('EUR');
    expect(d.totals.totalOrg).toBe(expected);
    expect(d.totals.ratesUsed).toEqual([
      { currency: 'GBP', rateToOrg: 1.172, asOf: '2026-12-01' },
      { currency: 'USD', rateToOrg: 0.915, asOf: '2026-12-01' },
    ]);
    expect(d.totals.short).toEqual(['Low-side switch', 'Freewheel diode']);
    const pull = d.lines.find((l) => l.key === 'pull');
    if (pull) {
      expect(pull.options).toEqual([]);
      expect(d.totals.unpriced).toEqual([expect.stringMatching(/^Pull-(up|down) resistor/)]);
    } else expect(d.totals.unpriced).toEqual([]);
  });
});

describe('shortlist figures at a buyer quantity', () => {
  it('at 1000 boards the need is 1020 and the reel source costs more again', async () => {
    const d = await fan(`?boards-${fanId}=1000`);
    expect(d.boards).toBe(1000);
    const o = pick(d, 'switch');
    // need 1000 × 1.02 = 1020. TSS-1: 102 strips = 1020 × 0.25 = 255.00 EUR.
    // TRH-1: 1020 → 2 reels = 2000 × 0.20 = 400.00 USD × 0.915 = 366.00 EUR.
    expect(line(d, 'switch').need).toBe(1020);
    expect(o.quotes.map((q) => [q.orderQty, q.converted?.amount])).toEqual([
      [1020, 255],
      [2000, 366],
    ]);
    expect(o.shortfall).toBe(820); // 1020 − 200
    // Diode: 1020 / 250 = 4.08 → 5 reels = 1250, break 1000 at 0.09 → 112.50 GBP × 1.172 = 131.85 EUR.
    expect(pick(d, 'diode').quote).toMatchObject({ orderQty: 1250, breakQty: 1000, extendedCost: 112.5, converted: { amount: 131.85 } });
  });

  it.each([['0'], ['-5'], ['ten'], ['2.5'], ['1000001']])('refuses boards=%s with a 400 naming the parameter', async (value) => {
    const res = await api().get(`/api/shortlist?boards-${fanId}=${value}`).set('Cookie', buyer);
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path)).toEqual([`boards-${fanId}`]);
  });

  it('shows the page with the shortfall in words and the converted total', async () => {
    const res = await api().get(`/shortlist?boards-${fanId}=500`).set('Cookie', buyer);
    expect(res.status).toBe(200);
    expect(res.text).toContain('✕ Short by 310: 200 in stock for 510 needed');
    expect(res.text).toContain(`Total of the chosen parts: ${chosen.driver ? '1620.95' : '1212.95'} EUR`);
    expect(res.text).toContain('1 USD = 0.9150 EUR (rate of 2026-12-01)');
  });
});

describe('a buyer preferred source and note (last in this file: they change the figures above)', () => {
  const put = (body: unknown, cookie = buyer) =>
    api()
      .put(`/api/designs/${fanId}/preferences`)
      .set('Cookie', cookie)
      .set('Origin', appUrl())
      .send(body as object);
  const sourceId = async (sku: string): Promise<number> => (await knex('part_sources').where({ sku }).first('id')).id as number;
  const rows = async () => (await knex('shortlist_preferences').count({ n: '*' }))[0].n;
  const events = async () => (await knex('audit_events').where({ action: 'shortlist_preference.set' }).count({ n: '*' }))[0].n;

  it('refuses a source of another part with a 409 naming sourceId, and writes nothing', async () => {
    const [beforeRows, beforeEvents] = [await rows(), await events()];
    const res = await put({ line: 'switch', partId: chosen.switch, sourceId: await sourceId('TPP-1'), note: null });
    expect(res.status).toBe(409);
    expect(res.body.issues.map((i: { path: string }) => i.path)).toEqual(['sourceId']);
    expect([await rows(), await events()]).toEqual([beforeRows, beforeEvents]);
  });

  it('refuses a part that is not an option of the line with a 409 naming partId', async () => {
    const res = await put({ line: 'switch', partId: chosen.diode, sourceId: null, note: 'x' });
    expect(res.status).toBe(409);
    expect(res.body.issues.map((i: { path: string }) => i.path)).toEqual(['partId']);
  });

  it('refuses a note longer than the column (501 characters) with a 400 naming note; 500 is taken', async () => {
    const long = await put({ line: 'switch', partId: chosen.switch, sourceId: null, note: 'n'.repeat(501) });
    expect(long.status).toBe(400);
    expect(long.body.issues.map((i: { path: string }) => i.path)).toEqual(['note']);
    const fits = await put({ line: 'switch', partId: chosen.switch, sourceId: null, note: 'é'.repeat(500) });
    expect(fits.status).toBe(200);
    expect(fits.body.preference.note).toBe('é'.repeat(500));
  });

  it('refuses a designer (buyers set preferences)', async () => {
    const res = await put({ line: 'switch', partId: chosen.switch, sourceId: null, note: 'x' }, await sessionCookie('designer'));
    expect(res.status).toBe(403);
  });

  it('buys from the preferred reel source: the switch line and the total follow, said "preferred by" the buyer', async () => {
    const res = await put({
      line: 'switch',
      partId: chosen.switch,
      sourceId: await sourceId('TRH-1'),
      note: 'Reel for the line; ask for the date code',
    });
    expect(res.status, res.text).toBe(200);
    expect(res.body.preference).toMatchObject({ source: { distributor: 'Test Reel House', sku: 'TRH-1' }, setByName: 'Bea Lindqvist' });
    const d = await fan();
    const o = pick(d, 'switch');
    // TRH-1 by hand (above): 1000 × 0.20 USD = 200.00 USD × 0.915 = 183.00 EUR instead of TSS-1's 127.50 EUR.
    expect([o.quote?.source.sku, o.quote?.converted?.amount]).toEqual(['TRH-1', 183]);
    // Total: 1620.95 − 127.50 + 183.00 = 1676.45 EUR (1212.95 − 127.50 + 183.00 = 1268.45 without a driver line).
    expect(d.totals.totalOrg).toBe(chosen.driver ? 1676.45 : 1268.45);
    const page = await api()
      .get(`/shortlist?boards-${fanId}=500`)
      .set('Cookie', await sessionCookie('designer'));
    expect(page.text).toContain('Test Reel House TRH-1 · preferred by Bea Lindqvist');
    expect(page.text).toContain('Note from Bea Lindqvist: Reel for the line; ask for the date code');
    expect(page.text).not.toContain('data-testid="preference-editor"'); // designers read only
  });

  it('records the change in the audit trail with the state before and after', async () => {
    const ev = await knex('audit_events').where({ action: 'shortlist_preference.set' }).orderBy('id', 'desc').first();
    expect(JSON.parse(ev.before_json)).toMatchObject({ source: null, note: 'é'.repeat(500) });
    expect(JSON.parse(ev.after_json)).toMatchObject({ source: { sku: 'TRH-1' }, note: 'Reel for the line; ask for the date code' });
  });

  it('shows the preference read-only on the design page to its designer', async () => {
    const page = await api()
      .get(`/designs/${fanId}`)
      .set('Cookie', await sessionCookie('designer'));
    expect(page.status).toBe(200);
    expect(page.text).toContain('Reel for the line; ask for the date code');
    expect(page.text).toContain('Test Reel House TRH-1');
  });

  it('keeps the preference when the sources are saved again (new ids, same SKU)', async () => {
    await setSources(chosen.switch, SWITCH);
    expect(pick(await fan(), 'switch').quote?.source.sku).toBe('TRH-1');
  });

  it('clearing source and note removes the row and the cheapest source is bought again', async () => {
    const res = await put({ line: 'switch', partId: chosen.switch, sourceId: null, note: '' });
    expect([res.status, res.body.preference]).toEqual([200, null]);
    expect(pick(await fan(), 'switch').quote?.source.sku).toBe('TSS-1');
  });
});

describe('the shortlist CSV (after the preferences above were cleared again)', () => {
  const csvAt = async (query: string) => {
    const res = await api().get(`/api/shortlist.csv${query}`).set('Cookie', buyer);
    expect(res.status, res.text.slice(0, 300)).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    const [header, ...records] = readCsvRecords(res.text).map((r) => r.cells);
    const rows = records.map((cells) => Object.fromEntries(header.map((h, i) => [h, cells[i]])));
    return { text: res.text, fan: rows.filter((r) => r.design_id === String(fanId)) };
  };
  const row = (rows: Record<string, string>[], kind: string, label: string, option = 'chosen') =>
    rows.find((r) => r.row === kind && r.line === label && (kind !== 'line' || r.option === option))!;

  it('has the figures of the hand tables at 500 boards', async () => {
    const { fan: rows } = await csvAt('');
    const pickCells = (r: Record<string, string>) => [
      r.need,
      r.sku,
      r.order_qty,
      r.break_qty,
      r.unit_price,
      r.currency,
      r.extended,
      r.converted,
    ];
    // Same hand figures as the tables above (switch, diode, motor).
    expect(pickCells(row(rows, 'line', 'Low-side switch'))).toEqual(['510', 'TSS-1', '510', '500', '0.25', 'EUR', '127.50', '127.50']);
    expect([row(rows, 'line', 'Low-side switch').stock, row(rows, 'line', 'Low-side switch').shortfall]).toEqual(['200', '310']);
    expect(pickCells(row(rows, 'line', 'Freewheel diode'))).toEqual(['510', 'TPP-1', '750', '100', '0.12', 'GBP', '90.00', '105.48']);
    expect(pickCells(row(rows, 'line', 'Motor'))).toEqual(['510', 'TMM-1', '510', '250', '2.1', 'USD', '1071.00', '979.97']);
    const total = row(rows, 'total', 'Total of the chosen parts');
    expect([total.converted, total.org_currency]).toEqual([chosen.driver ? '1620.95' : '1212.95', 'EUR']);
    expect(rows.filter((r) => r.row === 'short').map((r) => r.line)).toEqual(['Low-side switch', 'Freewheel diode']);
    expect(rows.filter((r) => r.row === 'rate').map((r) => [r.currency, r.unit_price, r.note])).toEqual([
      ['GBP', '1.172', 'rate of 2026-12-01'],
      ['USD', '0.915', 'rate of 2026-12-01'],
    ]);
  });

  it('follows the build quantity: at 1000 boards the diode is 5 reels at the 1000 break', async () => {
    const { fan: rows } = await csvAt(`?boards-${fanId}=1000`);
    const diode = row(rows, 'line', 'Freewheel diode');
    // Hand table above: 1020 → 1250, 112.50 GBP → 131.85 EUR.
    expect([diode.boards, diode.need, diode.order_qty, diode.extended, diode.converted]).toEqual([
      '1000',
      '1020',
      '1250',
      '112.50',
      '131.85',
    ]);
  });

  it('writes a note that starts like a formula with a leading apostrophe (OWASP CSV injection)', async () => {
    const note = '=HYPERLINK("http://example.invalid","x")';
    const res = await api()
      .put(`/api/designs/${fanId}/preferences`)
      .set('Cookie', buyer)
      .set('Origin', appUrl())
      .send({ line: 'diode', partId: chosen.diode, sourceId: null, note });
    expect(res.status, res.text).toBe(200);
    const { text, fan: rows } = await csvAt('');
    expect(text).not.toMatch(/,=HYPERLINK|,"=HYPERLINK/);
    expect(row(rows, 'line', 'Freewheel diode').note).toBe(`'${note}`);
  });

  it('refuses a bad build quantity with a 400 naming the parameter', async () => {
    const res = await api().get(`/api/shortlist.csv?boards-${fanId}=0`).set('Cookie', buyer);
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path)).toEqual([`boards-${fanId}`]);
  });
});
