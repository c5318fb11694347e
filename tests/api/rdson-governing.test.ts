/**
 * The RDS(on) filter on the governing line per VGS interval gives the same parts as the rule in README
 * "Searching the catalogue", on five MOSFETs built here. Which part qualifies at which drive is written out
 * by hand below (not computed), from the rule: the 25 °C line at the highest VGS not above the drive must
 * have a maximum at or below the bound; a part without such a line is left out.
 *
 *   part  25 °C lines (VGS V → max Ω)           other lines
 *   A     4.5 → 0.030, 10 → 0.020
 *   B     2.5 → 0.050, 4.5 → 0.025, 10 → 0.018
 *   C     10 → 0.010
 *   D     4.5 → 0.015                           10 V at 125 °C → 0.005
 *   E     1.8 → 0.040, 2.5 → 0.024, 4.5 → 0.012
 */
import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';

const tag = Date.now().toString(36).toUpperCase();
const PACKAGE = `GOV-${tag}`; // a package only these parts use, so the filter result is theirs alone
const line = (vgsV: number, maxOhm: number, tjC = 25) => ({ vgsV, tjC, maxOhm, typOhm: null, idA: null });
const LINES: Record<string, ReturnType<typeof line>[]> = {
  A: [line(4.5, 0.03), line(10, 0.02)],
  B: [line(2.5, 0.05), line(4.5, 0.025), line(10, 0.018)],
  C: [line(10, 0.01)],
  D: [line(4.5, 0.015), line(10, 0.005, 125)],
  E: [line(1.8, 0.04), line(2.5, 0.024), line(4.5, 0.012)],
};
const mosfet = (name: string) => ({
  category: 'mosfet',
  manufacturer: 'Invented Governing Semis',
  mpn: `GOV${name}-${tag}`,
  description: `Test MOSFET ${name}`,
  package: PACKAGE,
  reviewStatus: 'approved',
  params: {
    channel: 'n',
    vdsMaxV: 30,
    vgsMaxV: 20,
    vgsThMinV: 0.5,
    vgsThMaxV: 1.2,
    vgsThTestCurrentA: 0.00025,
    idContinuousA: 4,
    idPulsedA: 20,
    qgTotalNc: 6,
    qgTestVgsV: 4.5,
    qgsNc: null,
    qgdNc: null,
    vPlateauV: null,
    rthJaCPerW: 250,
    tjMaxC: 150,
    bodyDiodeVfV: null,
    rdsOn: LINES[name],
    zthPoints: [],
  },
  sources: [],
});

let cookie = '';
const idOf: Record<string, number> = {};
beforeAll(async () => {
  cookie = await sessionCookie('librarian');
  for (const name of Object.keys(LINES)) {
    const res = await request(appUrl()).post('/api/parts').set('Cookie', cookie).send(mosfet(name));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    idOf[name] = res.body.id;
  }
});

async function names(query: Record<string, number>): Promise<string[]> {
  const res = await request(appUrl())
    .get('/api/parts')
    .query({ category: 'mosfet', package: PACKAGE, pageSize: 50, ...query })
    .set('Cookie', cookie);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  expect(res.body.total).toBe(res.body.items.length);
  const byId = new Map(Object.entries(idOf).map(([n, id]) => [id, n]));
  return res.body.items.map((p: { id: number }) => byId.get(p.id)).sort();
}

describe('RDS(on) filter on the governing line per VGS interval', () => {
  // At the standard drives, bound 25 mΩ (by hand from the table above).
  it.each([
    [1.8, []],
    [2.5, ['E']],
    [3.3, ['E']],
    [4.5, ['B', 'D', 'E']],
    [5, ['B', 'D', 'E']],
    [10, ['A', 'B', 'C', 'D', 'E']],
  ])('at %s V, ≤ 25 mΩ: %j', async (vgsV, expected) => {
    expect(await names({ rdsOnAtVgsV: vgsV, rdsOnMaxOhm: 0.025 })).toEqual(expected);
  });

  it.each([
    [10, 0.015, ['C', 'D', 'E']], // A 20 mΩ and B 18 mΩ at 10 V are above; D governed by 4.5 V (the 125 °C line never)
    [9.99, 0.019, ['D', 'E']], // just below 10 V the 4.5 V lines govern: A 30, B 25 mΩ too high
    [6, 0.02, ['D', 'E']],
    [12, 0.0101, ['C']], // above the highest line that line governs
    [2.5, 0.1, ['B', 'E']],
  ])('at %s V, ≤ %s Ω: %j', async (vgsV, maxOhm, expected) => {
    expect(await names({ rdsOnAtVgsV: vgsV, rdsOnMaxOhm: maxOhm })).toEqual(expected);
  });

  it('pages of the bound with other filters, as a designer sees them, add up to the whole list and its count', async () => {
    // By hand from the table: at 10 V every part's governing line is ≤ 25 mΩ (A 20, B 18, C 10, D 15 at
    // 10 V; E's 4.5 V line 12 mΩ), all are N-channel 30 V and approved; in part-number order A…E.
    // VDS ≥ 31 V leaves none (all are 30 V parts).
    const designer = await sessionCookie('designer');
    const page = async (n: number, vdsMinV: number) => {
      const res = await request(appUrl())
        .get('/api/parts')
        .query({ category: 'mosfet', package: PACKAGE, channel: 'n', vdsMinV, rdsOnAtVgsV: 10, rdsOnMaxOhm: 0.025, pageSize: 2, page: n })
        .set('Cookie', designer);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      return res.body as { total: number; items: { id: number }[] };
    };
    const pages = [await page(1, 30), await page(2, 30), await page(3, 30), await page(4, 30)];
    expect(pages.map((p) => p.total)).toEqual([5, 5, 5, 5]);
    expect(pages.flatMap((p) => p.items.map((x) => x.id))).toEqual(['A', 'B', 'C', 'D', 'E'].map((n) => idOf[n]));
    expect((await page(1, 31)).total).toBe(0);
  });

  it('a drive alone keeps the parts characterised at or below it', async () => {
    expect(await names({ rdsOnAtVgsV: 4.5 })).toEqual(['A', 'B', 'D', 'E']);
  });

  it('an edit of the lines moves the part between drives', async () => {
    const got = (await request(appUrl()).get(`/api/parts/${idOf.C}`).set('Cookie', cookie)).body;
    const { id: _id, ...rest } = got;
    const res = await request(appUrl())
      .put(`/api/parts/${idOf.C}`)
      .set('Cookie', cookie)
      .send({ ...rest, params: { ...got.params, rdsOn: [line(4.5, 0.02), line(10, 0.01)] }, version: got.version });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // C now has a 4.5 V line of 20 mΩ: it joins B, D, E at 4.5 V and 25 mΩ.
    expect(await names({ rdsOnAtVgsV: 4.5, rdsOnMaxOhm: 0.025 })).toEqual(['B', 'C', 'D', 'E']);
    expect(await names({ rdsOnAtVgsV: 10, rdsOnMaxOhm: 0.0101 })).toEqual(['C']);
  });
});
