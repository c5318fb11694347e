import { afterAll, describe, expect, it } from 'vitest';
import { scratchDb } from '../helpers/stack.ts';
import { seed, demoParts } from '../../db/seeds/demo.ts';
import { demoDesigns } from '../../db/seeds/designs.ts';

const db = scratchDb();
afterAll(() => db.destroy());

const TABLES = [
  'users',
  'user_roles',
  'parts',
  'mosfet_params',
  'mosfet_rds_on_points',
  'mosfet_zth_points',
  'driver_params',
  'diode_params',
  'motor_params',
  'part_sources',
  'part_price_breaks',
  'designs',
  'design_revisions',
  'design_parts',
  'currency_rates',
];

async function counts(): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const t of TABLES) out[t] = Number((await db(t).count({ n: '*' }))[0].n);
  return out;
}

describe('demo seed', () => {
  it('gives the same counts when run twice', async () => {
    await db.migrate.rollback(undefined, true);
    await db.migrate.latest();
    await seed(db);
    const once = await counts();
    const report = await seed(db);
    expect(report).toEqual({ partsAdded: 0, designsAdded: 0 });
    expect(await counts()).toEqual(once);
    expect(once.parts).toBe(demoParts().length);
    expect(once.designs).toBe(demoDesigns.length);
  });

  it('meets the catalogue minimums of the demo scenario', async () => {
    const rows: { category: string; n: number }[] = await db('parts').select('category').count({ n: '*' }).groupBy('category');
    const by = Object.fromEntries(rows.map((r) => [r.category, Number(r.n)]));
    expect(by.motor).toBeGreaterThanOrEqual(12);
    expect(by.mosfet).toBeGreaterThanOrEqual(40);
    expect(by.driver).toBeGreaterThanOrEqual(12);
    expect(by.diode).toBeGreaterThanOrEqual(15);
    expect(Number((await db('parts').where('review_status', 'pending').count({ n: '*' }))[0].n)).toBeGreaterThan(0);
    expect(Number((await db('parts').whereIn('lifecycle', ['nrnd', 'obsolete']).count({ n: '*' }))[0].n)).toBeGreaterThan(0);
    const withoutSource = await db('parts')
      .leftJoin('part_sources', 'parts.id', 'part_sources.part_id')
      .whereNull('part_sources.id')
      .count({ n: '*' });
    expect(Number(withoutSource[0].n)).toBe(0);
  });

  it('seeds invented pack sizes and rates into the default organisation currency (EUR)', async () => {
    // Hand-written from db/seeds/demo.ts and db/seeds/data/index.ts: Kelderhaus strips of 10, Fenwick Row
    // strips of 5, everything else and every motor sold singly; 1 USD = 0.915 EUR, 1 GBP = 1.172 EUR.
    const multiples: { distributor: string; motor: number; m: number }[] = await db('part_sources as s')
      .join('parts as p', 'p.id', 's.part_id')
      .select('s.distributor', db.raw("p.category = 'motor' as motor"), 's.order_multiple as m')
      .groupBy('s.distributor', 'motor', 's.order_multiple');
    const seen = multiples.map((r) => `${r.distributor}|${Number(r.motor) ? 'motor' : 'semi'}|${r.m}`).sort();
    for (const line of seen)
      expect([
        'Ashdown Component Supply|motor|1',
        'Ashdown Component Supply|semi|1',
        'Fenwick Row Electronics|motor|1',
        'Fenwick Row Electronics|semi|5',
        'Kelderhaus Bauteile|motor|1',
        'Kelderhaus Bauteile|semi|10',
      ]).toContain(line);
    expect(seen).toContain('Kelderhaus Bauteile|semi|10');
    const rates = await db('currency_rates').orderBy('currency').select('currency', 'rate_to_org', 'as_of');
    expect(rates.map((r) => [r.currency, Number(r.rate_to_org)])).toEqual([
      ['GBP', 1.172],
      ['USD', 0.915],
    ]);
  });
});
