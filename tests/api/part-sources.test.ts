/**
 * Supply data through PUT /api/parts/:id/sources (issue 13 item 2): a buyer's save reads back equal, is one
 * versioned write with one audit row (before and after), a stale version is a 409, every refusal is a 400
 * naming its field and writes nothing, designers may not write, and the history reads the change in words.
 * Expected texts and paths are written by hand here; the column limits come from the migrations
 * (INT UNSIGNED max 4 294 967 295, DECIMAL(12,5)). All names and SKUs are invented.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie, type DemoRole } from '../helpers/session.ts';

const knex = appDb();
const cookies = {} as Record<DemoRole, string>;
beforeAll(async () => {
  for (const role of ['librarian', 'designer', 'buyer'] as const) cookies[role] = await sessionCookie(role);
});
afterAll(() => knex.destroy());

const send = (method: 'get' | 'put' | 'post', path: string, role: DemoRole, body?: unknown) => {
  const r = request(appUrl())[method](path).set('Cookie', cookies[role]);
  return body === undefined ? r : r.set('Content-Type', 'application/json').send(JSON.stringify(body));
};
const historyText = (html: string): string => {
  const from = html.indexOf('id="h-history"');
  return html
    .slice(from, html.indexOf('</section>', from))
    .replace(/<[^>]+>/g, ' ')
    .replace(/&gt;/g, '>')
    .replace(/\s+/g, ' ');
};

let serial = 0;
/** A fresh approved invented diode with one source, so each test owns its record. */
async function freshPart(): Promise<{ id: number; version: number }> {
  serial += 1;
  const res = await send('post', '/api/parts', 'librarian', {
    category: 'diode',
    manufacturer: 'Ostler Rectifier Works',
    mpn: `ORS${40 + serial}-SUP-T${Date.now().toString(36)}`,
    description: 'Test Schottky diode for the supply form',
    package: 'SMA',
    reviewStatus: 'approved',
    params: { kind: 'schottky', vrrmV: 40, ifAvA: 1, ifsmA: 30, vfV: 0.5, vfAtIfA: 1, trrNs: null },
    sources: [baseSource()],
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { id: res.body.id, version: res.body.version };
}
const baseSource = () => ({
  distributor: 'Fenwick Row Electronics',
  sku: 'FRE-T1',
  moq: 1,
  orderMultiple: 5,
  leadTimeDays: 7,
  stockQty: 200,
  currency: 'EUR',
  priceBreaks: [
    { qty: 1, unitPrice: 0.4 },
    { qty: 100, unitPrice: 0.25 },
  ],
});
const auditCount = async (id: number): Promise<number> =>
  Number((await knex('audit_events').where({ entity_type: 'part', entity_id: id }).count({ n: '*' }).first())!.n);
const stored = async (id: number) => ({
  version: (await knex('parts').where({ id }).first('version')).version as number,
  audits: await auditCount(id),
  sources: (await send('get', `/api/parts/${id}`, 'librarian')).body.sources,
});

describe('PUT /api/parts/:id/sources', () => {
  it('a buyer saves two sources; reading back gives the same figures, one version up, one audit row with before and after', async () => {
    const part = await freshPart();
    const audits = await auditCount(part.id);
    const sources = [
      { ...baseSource(), stockQty: 1240 },
      {
        distributor: 'Kelderhaus Bauteile',
        sku: 'KB-55-T',
        moq: 10,
        orderMultiple: 10,
        leadTimeDays: 21,
        stockQty: 0,
        currency: 'USD',
        priceBreaks: [
          { qty: 10, unitPrice: 0.31 },
          { qty: 1000, unitPrice: 0.12345 },
        ],
      },
    ];
    const res = await send('put', `/api/parts/${part.id}/sources`, 'buyer', { sources, version: part.version });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.version).toBe(part.version + 1);
    const back = (await send('get', `/api/parts/${part.id}`, 'buyer')).body;
    expect(back.sources.map(({ id: _id, ...s }: { id: number }) => s)).toEqual(sources);
    expect(await auditCount(part.id)).toBe(audits + 1);
    const event = await knex('audit_events').where({ entity_type: 'part', entity_id: part.id }).orderBy('id', 'desc').first();
    expect(event.action).toBe('part.sources');
    expect(JSON.parse(event.before_json).sources.map((s: { stockQty: number }) => s.stockQty)).toEqual([200]);
    expect(JSON.parse(event.after_json).sources.map((s: { stockQty: number }) => s.stockQty)).toEqual([1240, 0]);
  });

  it.each<[string, (s: ReturnType<typeof baseSource>[]) => void, string]>([
    [
      'breaks not ascending',
      (s) =>
        (s[1].priceBreaks = [
          { qty: 50, unitPrice: 0.2 },
          { qty: 20, unitPrice: 0.3 },
        ]),
      'sources.1.priceBreaks.1.qty',
    ],
    ['a zero unit price', (s) => (s[1].priceBreaks[0].unitPrice = 0), 'sources.1.priceBreaks.0.unitPrice'],
    ['an unit price past DECIMAL(12,5)', (s) => (s[0].priceBreaks[1].unitPrice = 10_000_000), 'sources.0.priceBreaks.1.unitPrice'],
    ['MOQ above the first break', (s) => (s[1].moq = 50), 'sources.1.moq'],
    ['order multiple 0', (s) => (s[1].orderMultiple = 0), 'sources.1.orderMultiple'],
    ['a currency that is no ISO 4217 code', (s) => (s[1].currency = 'EUO'), 'sources.1.currency'],
    ['stock past INT UNSIGNED', (s) => (s[0].stockQty = 4_294_967_296), 'sources.0.stockQty'],
    ['fractional lead time', (s) => (s[1].leadTimeDays = 1.5), 'sources.1.leadTimeDays'],
  ])('%s: 400 naming the field, nothing written', async (_name, spoil, path) => {
    const part = await freshPart();
    const before = await stored(part.id);
    const sources = [baseSource(), { ...baseSource(), sku: 'FRE-T2', priceBreaks: [{ qty: 1, unitPrice: 0.5 }] }];
    spoil(sources);
    const res = await send('put', `/api/parts/${part.id}/sources`, 'buyer', { sources, version: part.version });
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path)).toEqual([path]);
    expect(res.body.error).toContain(path);
    expect(await stored(part.id)).toEqual(before);
  });

  it('a save on a stale version is a 409 and leaves the newer save in place', async () => {
    const part = await freshPart();
    const first = await send('put', `/api/parts/${part.id}/sources`, 'buyer', {
      sources: [{ ...baseSource(), stockQty: 300 }],
      version: part.version,
    });
    expect(first.status).toBe(200);
    const before = await stored(part.id);
    const stale = await send('put', `/api/parts/${part.id}/sources`, 'librarian', {
      sources: [{ ...baseSource(), stockQty: 999 }],
      version: part.version,
    });
    expect(stale.status).toBe(409);
    expect(await stored(part.id)).toEqual(before);
    expect(before.sources[0].stockQty).toBe(300);
  });

  it('saving the sources as loaded writes no version and no audit row', async () => {
    const part = await freshPart();
    const before = await stored(part.id);
    const res = await send('put', `/api/parts/${part.id}/sources`, 'buyer', { sources: [baseSource()], version: part.version });
    expect(res.status).toBe(200);
    expect(await stored(part.id)).toEqual(before);
  });

  it('designers read supply data but may not save it, and get no form; buyers and librarians get the form', async () => {
    const part = await freshPart();
    const before = await stored(part.id);
    const res = await send('put', `/api/parts/${part.id}/sources`, 'designer', { sources: [], version: part.version });
    expect(res.status).toBe(403);
    expect(await stored(part.id)).toEqual(before);
    const designerPage = (await send('get', `/parts/${part.id}`, 'designer')).text;
    expect(designerPage).toContain('FRE-T1');
    expect(designerPage).not.toContain('data-testid="supply-edit"');
    for (const role of ['buyer', 'librarian'] as const)
      expect((await send('get', `/parts/${part.id}`, role)).text).toContain('data-testid="supply-edit"');
  });

  it('the history reads the change in words: stock with thousands separator, each break that moved, the added source', async () => {
    const part = await freshPart();
    const sources = [
      {
        ...baseSource(),
        stockQty: 1240,
        priceBreaks: [
          { qty: 1, unitPrice: 0.4 },
          { qty: 100, unitPrice: 0.22 },
          { qty: 1000, unitPrice: 0.18 },
        ],
      },
      {
        ...baseSource(),
        distributor: 'Ashdown Component Supply',
        sku: 'ACS-T9',
        moq: 1,
        orderMultiple: 1,
        leadTimeDays: 1,
        stockQty: 15,
        priceBreaks: [],
      },
    ];
    const res = await send('put', `/api/parts/${part.id}/sources`, 'buyer', { sources, version: part.version });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const text = historyText((await send('get', `/parts/${part.id}`, 'designer')).text);
    expect(text).toContain('Supply data changed');
    expect(text).toContain(
      'Fenwick Row Electronics FRE-T1: stock 200 → 1,240; break 100: 0.2500 → 0.2200 EUR; added break 1,000: 0.1800 EUR',
    );
    expect(text).toContain('added source Ashdown Component Supply ACS-T9: stock 15, MOQ 1, order multiple 1, lead time 1 day, prices none');
  });
});
