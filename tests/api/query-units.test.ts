/**
 * Unit queries through the API: the search page turns "schottky 40 V" into the API's own filter
 * parameters (src/lib/query-units.ts); those parameters must return exactly the Schottky diodes with
 * VRRM ≥ 40 V. The expected part numbers are a hand list read from db/seeds/data/diodes.ts (kind and
 * VRRM of each seed diode), not computed by the code under test. Other tests may add parts, so only seed
 * part numbers are compared, and every returned part must satisfy the bound.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';
import { demoDiodes } from '../../db/seeds/data/index.ts';
import { parseQueryUnits } from '../../src/lib/query-units.ts';
import type { Part } from '../../src/lib/domain/parts.ts';

/** Hand list from db/seeds/data/diodes.ts: Schottky, VRRM 40, 40, 40, 45 (pending review), 60, 100, 100 V. */
const SCHOTTKY_40V_APPROVED = ['ORS10-100-MA', 'ORS10-40-D123', 'ORS20-40-MA', 'ORS20-60-MA', 'ORS30-100-MB', 'ORS30-40-MB'];
const SCHOTTKY_40V_ALL = [...SCHOTTKY_40V_APPROVED, 'ORS50-45-A201'].sort();

let librarian = '';
let buyer = '';
beforeAll(async () => {
  librarian = await sessionCookie('librarian');
  buyer = await sessionCookie('buyer');
});

async function search(cookie: string, query: Record<string, string>): Promise<Part[]> {
  const res = await request(appUrl())
    .get('/api/parts')
    .query({ ...query, pageSize: 200 })
    .set('Cookie', cookie);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  expect(res.body.total).toBe(res.body.items.length);
  return res.body.items as Part[];
}

describe('"schottky 40 V" as API filters', () => {
  const seedMpns = new Set(demoDiodes.map((d) => d.mpn));
  const { filters, rest } = parseQueryUnits('schottky 40 V');

  it('leaves no text and asks for kind and VRRM', () => {
    expect(rest).toBe('');
    expect(filters).toEqual({ category: 'diode', kind: 'schottky', vrrmMinV: '40' });
  });

  it('returns exactly the seed Schottky diodes with VRRM ≥ 40 V (librarian sees pending parts too)', async () => {
    const items = await search(librarian, filters);
    for (const p of items) {
      expect(p.category).toBe('diode');
      if (p.category === 'diode') {
        expect(p.params.kind).toBe('schottky');
        expect(p.params.vrrmV).toBeGreaterThanOrEqual(40);
      }
    }
    expect(
      items
        .map((p) => p.mpn)
        .filter((m) => seedMpns.has(m))
        .sort(),
    ).toEqual(SCHOTTKY_40V_ALL);
  });

  it('a buyer gets the approved ones', async () => {
    const items = await search(buyer, filters);
    expect(
      items
        .map((p) => p.mpn)
        .filter((m) => seedMpns.has(m))
        .sort(),
    ).toEqual([...SCHOTTKY_40V_APPROVED].sort());
  });

  it('the same words as plain text would not have narrowed by VRRM (the filters matter)', async () => {
    // ORS05-30-D323 (30 V) and ORS10-20-D123 (20 V) are Schottky parts below the bound: kind alone keeps them.
    const kindOnly = (await search(librarian, { category: 'diode', kind: 'schottky' })).map((p) => p.mpn);
    expect(kindOnly).toEqual(expect.arrayContaining(['ORS05-30-D323', 'ORS10-20-D123']));
  });
});

describe('other unit queries are accepted by the API as they are', () => {
  it.each(['n-channel 30 V 2.5 V logic', 'p-channel 60V 10 mΩ', 'gate driver 12 V', 'diode 2 A', 'logic-level mosfet 5 A'])(
    '%s → 200',
    async (q) => {
      const { filters } = parseQueryUnits(q);
      expect(Object.keys(filters).length).toBeGreaterThan(1);
      await search(librarian, filters);
    },
  );
});

describe('units in q= read by the API itself', () => {
  const seedMpns = new Set(demoDiodes.map((d) => d.mpn));
  const seedOnly = (items: Part[]) =>
    items
      .map((p) => p.mpn)
      .filter((m) => seedMpns.has(m))
      .sort();

  it('"schottky 40 V" as text gives the same parts as the filters, and says what it understood', async () => {
    const res = await request(appUrl()).get('/api/parts').query({ q: 'schottky 40 V', pageSize: 200 }).set('Cookie', librarian);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(seedOnly(res.body.items)).toEqual(SCHOTTKY_40V_ALL);
    expect(res.body.understood.filters).toEqual({ category: 'diode', kind: 'schottky', vrrmMinV: '40' });
    // Hand-written chip labels, as the search page shows them.
    expect(res.body.understood.chips.map((c: { label: string }) => c.label)).toEqual(['Diodes', 'Schottky', 'VRRM ≥ 40 V']);
    expect(res.body.understood.q).toBeNull();
  });

  it('an explicit filter wins over the one in the text: VRRM ≥ 60 V keeps the 60 and 100 V Schottky parts', async () => {
    const res = await request(appUrl())
      .get('/api/parts')
      .query({ q: 'schottky 40 V', vrrmMinV: '60', pageSize: 200 })
      .set('Cookie', librarian);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // Hand list from db/seeds/data/diodes.ts: the Schottky diodes rated 60 V and 100 V.
    expect(seedOnly(res.body.items)).toEqual(['ORS10-100-MA', 'ORS20-60-MA', 'ORS30-100-MB']);
    expect(res.body.understood.filters).toEqual({ category: 'diode', kind: 'schottky' });
  });

  it('units=off keeps the words as text (no filter understood), and a bad value names the field', async () => {
    const off = await request(appUrl()).get('/api/parts').query({ q: 'schottky 40 V', units: 'off' }).set('Cookie', librarian);
    expect(off.status).toBe(200);
    expect(off.body.understood).toEqual({ filters: {}, chips: [], q: 'schottky 40 V' });
    const bad = await request(appUrl()).get('/api/parts').query({ q: 'schottky 40 V', units: 'maybe' }).set('Cookie', librarian);
    expect(bad.status).toBe(400);
    expect(bad.body.issues.map((i: { path: string }) => i.path)).toContain('units');
  });

  it('a part number stays text: QX-like words are not read as quantities', async () => {
    const res = await request(appUrl()).get('/api/parts').query({ q: 'ORS20-40-MA' }).set('Cookie', librarian);
    expect(res.status).toBe(200);
    expect(res.body.understood.filters).toEqual({});
    expect(res.body.items[0]?.mpn).toBe('ORS20-40-MA');
  });
});
