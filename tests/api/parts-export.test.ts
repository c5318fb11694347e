/**
 * The parts CSV export sends every matching part, also past every page and chunk size the server uses
 * (500 parts per read, the 5,000 the export used to stop at): 5,200 generated parts (invented makers and
 * numbers, scripts/bench/catalogue.ts) go into the test database with multi-row inserts, then the export
 * is compared with the parts table read here with SQL of its own (the second method): the same number
 * of rows, the same maker and part number for every id, in part-number order, X-Row-Count equal.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import Papa from 'papaparse';
import { appDb, appUrl } from '../helpers/stack.ts';
import { demoAddress, sessionCookie } from '../helpers/session.ts';
import { insertPartsBulk } from '../../src/server/repos/part-bulk.ts';
import { generateCatalogue } from '../../scripts/bench/catalogue.ts';

const knex = appDb();
const parts = [...generateCatalogue({ mosfets: 3_000, diodes: 1_200, drivers: 600, motors: 400 }, 5200)];
let librarian = '';
let designer = '';

beforeAll(async () => {
  [librarian, designer] = await Promise.all([sessionCookie('librarian'), sessionCookie('designer')]);
  await knex.transaction((trx) => insertPartsBulk(trx, parts, null));
}, 120_000);
afterAll(() => knex.destroy());

async function exportCsv(cookie: string, query: string): Promise<{ rows: Record<string, string>[]; rowCount: string; text: string }> {
  const res = await request(appUrl())
    .get(`/api/parts.csv?${query}`)
    .set('Cookie', cookie)
    .buffer(true)
    .parse((r, cb) => {
      let text = '';
      r.setEncoding('utf8');
      r.on('data', (c: string) => (text += c));
      r.on('end', () => cb(null, text));
    });
  expect(res.status).toBe(200);
  const text = res.body as string;
  const rows = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true, delimiter: ',' }).data;
  return { rows, rowCount: res.headers['x-row-count'], text };
}

const key = (maker: string, mpn: string) => `${maker}\u0000${mpn}`;

describe('GET /api/parts.csv past every page size', () => {
  it('a librarian gets all 5,200 generated parts and every other part, each once, in part-number order', async () => {
    expect(parts.length).toBe(5_200);
    const db: { id: number; manufacturer: string; mpn: string }[] = await knex('parts').select('id', 'manufacturer', 'mpn');
    expect(db.length).toBeGreaterThan(5_200);
    const { rows, rowCount, text } = await exportCsv(librarian, 'sort=mpn');
    expect(rows.length).toBe(db.length);
    expect(rowCount).toBe(String(db.length));
    expect(text.split('\r\n').length).toBe(db.length + 2); // header, the rows, the final line end
    // Every id of the table is in the file exactly once (maker and part number are unique together).
    const exported = new Set(rows.map((r) => key(r.manufacturer, r.mpn)));
    expect(exported.size).toBe(db.length);
    expect(db.filter((p) => !exported.has(key(p.manufacturer, p.mpn))).map((p) => p.id)).toEqual([]);
    // A few of the generated parts by id, among them the 5,001st and the last.
    for (const i of [0, 499, 500, 4_999, 5_000, 5_199]) {
      const id = db.find((p) => p.manufacturer === parts[i].manufacturer && p.mpn === parts[i].mpn)?.id;
      expect(id, parts[i].mpn).toBeDefined();
      expect(rows.filter((r) => r.mpn === parts[i].mpn && r.manufacturer === parts[i].manufacturer)).toHaveLength(1);
    }
    // Part-number order, as the database sorts them (its collation), read here with one ORDER BY.
    const ordered: { mpn: string }[] = await knex('parts')
      .select('mpn')
      .orderBy([{ column: 'mpn' }, { column: 'id' }]);
    expect(rows.map((r) => r.mpn)).toEqual(ordered.map((r) => r.mpn));
  });

  it('a designer gets every approved MOSFET and their own proposals, nothing pending of others (filtered export)', async () => {
    const me = await knex('users')
      .where({ email: demoAddress('designer') })
      .first('id');
    const [{ n }] = await knex('parts')
      .where({ category: 'mosfet' })
      .where((w) => w.where('review_status', 'approved').orWhere('created_by', me.id))
      .count({ n: '*' });
    const expected = Number(n);
    expect(expected).toBeGreaterThan(2_000); // about 88 % of the 3,000 generated MOSFETs are approved
    const { rows, rowCount } = await exportCsv(designer, 'category=mosfet');
    expect(rows.length).toBe(expected);
    expect(rowCount).toBe(String(expected));
    expect(new Set(rows.map((r) => r.category))).toEqual(new Set(['mosfet']));
  });
});
