/**
 * GET /api/parts filters return exactly the parts that satisfy them. Expected sets come from a plain
 * filter written here over the invented seed catalogue (db/seeds/data), following the rules stated in
 * README "Searching the catalogue"; every returned item must also pass the same filter (other tests may
 * have added parts, which must obey the filter too). A librarian asks, because librarians see every part
 * whatever its review status (designers and buyers see approved parts and their own: parts-visibility.test.ts).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';
import { demoParts } from '../../db/seeds/data/index.ts';
import type { Part } from '../../src/lib/domain/parts.ts';

type Seed = (typeof demoParts)[number];
type Pred = (p: Part | Seed) => boolean;
let cookie = '';
beforeAll(async () => {
  cookie = await sessionCookie('librarian');
});

async function getAll(query: Record<string, string | number | boolean>): Promise<Part[]> {
  const items: Part[] = [];
  for (let page = 1; ; page++) {
    const res = await request(appUrl())
      .get('/api/parts')
      .query({ ...query, page, pageSize: 200 })
      .set('Cookie', cookie);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    items.push(...res.body.items);
    if (items.length >= res.body.total) return items;
  }
}

/** Rule: the 25 °C line at the highest VGS not above the drive must have max ≤ bound. */
function rdsOnAt(p: Part | Seed, driveV: number): number | null {
  if (p.category !== 'mosfet') return null;
  const usable = p.params.rdsOn.filter((r) => Math.abs(r.tjC - 25) <= 1 && r.vgsV <= driveV).sort((a, b) => b.vgsV - a.vgsV);
  return usable.length ? usable[0].maxOhm : null;
}

const M =
  (f: (p: Extract<Seed, { category: 'mosfet' }>['params']) => boolean): Pred =>
  (p) =>
    p.category === 'mosfet' && f(p.params);
const D =
  (f: (p: Extract<Seed, { category: 'driver' }>['params']) => boolean): Pred =>
  (p) =>
    p.category === 'driver' && f(p.params);
const G =
  (f: (p: Extract<Seed, { category: 'diode' }>['params']) => boolean): Pred =>
  (p) =>
    p.category === 'diode' && f(p.params);
const W =
  (f: (p: Extract<Seed, { category: 'motor' }>['params']) => boolean): Pred =>
  (p) =>
    p.category === 'motor' && f(p.params);
const acceptsLogic = (d: Extract<Seed, { category: 'driver' }>['params'], railV: number, supplyV?: number): boolean =>
  d.inputLogic === 'fixed'
    ? d.inputHighMin <= railV
    : d.inputLogic === 'ratio'
      ? d.inputHighMin * (supplyV ?? d.supplyMinV) <= railV
      : true;

const CASES: [string, Record<string, string | number | boolean>, Pred][] = [
  ['MOSFET VDS ≥ 30 V', { category: 'mosfet', vdsMinV: 30 }, M((p) => p.vdsMaxV >= 30)],
  ['MOSFET VGS(th) max ≤ 1 V', { category: 'mosfet', vgsThMaxV: 1 }, M((p) => p.vgsThMaxV <= 1)],
  ['MOSFET characterised at 1.8 V', { category: 'mosfet', rdsOnAtVgsV: 1.8 }, M((p) => Math.min(...p.rdsOn.map((r) => r.vgsV)) <= 1.8)],
  [
    'MOSFET RDS(on) ≤ 100 mΩ at 2.5 V',
    { category: 'mosfet', rdsOnAtVgsV: 2.5, rdsOnMaxOhm: 0.1 },
    (p) => (rdsOnAt(p, 2.5) ?? Infinity) <= 0.1,
  ],
  [
    'MOSFET RDS(on) ≤ 50 mΩ at 3.3 V (judged at the 2.5 V line)',
    { category: 'mosfet', rdsOnAtVgsV: 3.3, rdsOnMaxOhm: 0.05 },
    (p) => (rdsOnAt(p, 3.3) ?? Infinity) <= 0.05,
  ],
  [
    'MOSFET RDS(on) ≤ 30 mΩ at 10 V',
    { category: 'mosfet', rdsOnAtVgsV: 10, rdsOnMaxOhm: 0.03 },
    (p) => (rdsOnAt(p, 10) ?? Infinity) <= 0.03,
  ],
  ['MOSFET ID ≥ 3 A and Qg ≤ 10 nC', { category: 'mosfet', idMinA: 3, qgMaxNc: 10 }, M((p) => p.idContinuousA >= 3 && p.qgTotalNc <= 10)],
  ['P-channel MOSFETs', { category: 'mosfet', channel: 'p' }, M((p) => p.channel === 'p')],
  ['MOSFETs in SOT-23', { category: 'mosfet', package: 'SOT-23' }, (p) => p.category === 'mosfet' && p.package === 'SOT-23'],
  [
    'driver at 12 V supply accepting 3.3 V logic',
    { category: 'driver', logicRailV: 3.3, supplyV: 12 },
    D((d) => d.supplyMinV <= 12 && d.supplyMaxV >= 12 && acceptsLogic(d, 3.3, 12)),
  ],
  ['driver input accepts 1.8 V logic', { category: 'driver', logicRailV: 1.8 }, D((d) => acceptsLogic(d, 1.8))],
  [
    'driver at 5 V supply accepting 3.3 V logic',
    { category: 'driver', logicRailV: 3.3, supplyV: 5 },
    D((d) => d.supplyMinV <= 5 && d.supplyMaxV >= 5 && acceptsLogic(d, 3.3, 5)),
  ],
  ['driver output high ≥ 10 V', { category: 'driver', outputHighMinV: 10 }, D((d) => d.supplyMaxV - d.outputHighDropV >= 10)],
  [
    'non-inverting driver at 12 V',
    { category: 'driver', supplyV: 12, inverting: false },
    D((d) => !d.inverting && d.supplyMinV <= 12 && d.supplyMaxV >= 12),
  ],
  ['Schottky diodes', { category: 'diode', kind: 'schottky' }, G((d) => d.kind === 'schottky')],
  ['diode VRRM ≥ 40 V and IF(AV) ≥ 1 A', { category: 'diode', vrrmMinV: 40, ifAvMinA: 1 }, G((d) => d.vrrmV >= 40 && d.ifAvA >= 1)],
  [
    'diode trr ≤ 50 ns (Schottky passes)',
    { category: 'diode', trrMaxNs: 50 },
    G((d) => (d.trrNs === null ? d.kind === 'schottky' : d.trrNs <= 50)),
  ],
  [
    'motor rated 5–12 V',
    { category: 'motor', ratedVoltageMinV: 5, ratedVoltageMaxV: 12 },
    W((m) => m.ratedVoltageV >= 5 && m.ratedVoltageV <= 12),
  ],
  ['motor no-load ≥ 10 000 rpm', { category: 'motor', noLoadSpeedMinRpm: 10000 }, W((m) => m.noLoadSpeedRpm >= 10000)],
  ['motor stall torque ≥ 10 mN·m', { category: 'motor', stallTorqueMinNm: 0.01 }, W((m) => m.stallTorqueNm >= 0.01)],
  ['filter key implies its category', { vrrmMinV: 100 }, G((d) => d.vrrmV >= 100)],
];

describe('GET /api/parts filters match a plain filter over the seed', () => {
  it.each(CASES)('%s', async (_name, query, pred) => {
    const expected = demoParts
      .filter(pred)
      .map((p) => p.mpn)
      .sort();
    expect(expected.length, 'the case should select some seed parts').toBeGreaterThan(0);
    expect(expected.length, 'the case should leave some seed parts out').toBeLessThan(
      demoParts.filter((p) => p.category === (query.category ?? 'diode')).length,
    );
    const items = await getAll(query);
    const seedMpns = new Set(demoParts.map((p) => p.mpn));
    expect(
      items
        .filter((p) => seedMpns.has(p.mpn))
        .map((p) => p.mpn)
        .sort(),
    ).toEqual(expected);
    for (const item of items) expect(pred(item), `${item.mpn} should satisfy the filter`).toBe(true);
  });

  it('lifecycle and review filters return exactly the parts in those states', async () => {
    const all = await getAll({});
    const nrnd = await getAll({ lifecycle: 'nrnd,obsolete' });
    expect(nrnd.map((p) => p.id).sort()).toEqual(
      all
        .filter((p) => ['nrnd', 'obsolete'].includes(p.lifecycle))
        .map((p) => p.id)
        .sort(),
    );
    expect(nrnd.length).toBeGreaterThan(0);
    const pending = await getAll({ reviewStatus: 'pending' });
    expect(pending.map((p) => p.id).sort()).toEqual(
      all
        .filter((p) => p.reviewStatus === 'pending')
        .map((p) => p.id)
        .sort(),
    );
  });
});

describe('GET /api/parts pages and sorts on the server', () => {
  it('pages concatenate to the whole sorted list, with total and page size', async () => {
    const whole = await getAll({ category: 'mosfet', sort: '-vdsMaxV' });
    const vds = whole.map((p) => (p.category === 'mosfet' ? p.params.vdsMaxV : NaN));
    expect(vds).toEqual([...vds].sort((a, b) => b - a));
    const collected: number[] = [];
    for (let page = 1; page <= Math.ceil(whole.length / 7); page++) {
      const res = await request(appUrl())
        .get('/api/parts')
        .query({ category: 'mosfet', sort: '-vdsMaxV', page, pageSize: 7 })
        .set('Cookie', cookie);
      expect(res.body).toMatchObject({ total: whole.length, page, pageSize: 7 });
      collected.push(...res.body.items.map((p: Part) => p.id));
    }
    expect(collected).toEqual(whole.map((p) => p.id));
  });

  it('sorts by part number ascending by default within a category', async () => {
    const res = await request(appUrl()).get('/api/parts').query({ category: 'diode', sort: 'mpn', pageSize: 200 }).set('Cookie', cookie);
    const mpns = res.body.items.map((p: Part) => p.mpn);
    expect(mpns).toEqual([...mpns].sort((a: string, b: string) => a.localeCompare(b, 'en', { sensitivity: 'base' })));
  });
});

describe('GET /api/parts text search', () => {
  it('finds a part number typed with one wrong character, best match first', async () => {
    const res = await request(appUrl()).get('/api/parts').query({ q: 'CWN3OL01-S3' }).set('Cookie', cookie); // letter O for zero
    expect(res.status).toBe(200);
    expect(res.body.items[0].mpn).toBe('CWN30L01-S3');
  });

  it('finds a part number with two characters swapped, within its category', async () => {
    const res = await request(appUrl()).get('/api/parts').query({ q: 'ORS01-40-D123', category: 'diode' }).set('Cookie', cookie);
    expect(res.body.items.map((p: Part) => p.mpn)).toContain('ORS10-40-D123');
  });

  it('matches maker names and combines with parameter filters', async () => {
    const res = await request(appUrl())
      .get('/api/parts')
      .query({ q: 'Thornbury', category: 'mosfet', vdsMinV: 60, pageSize: 200 })
      .set('Cookie', cookie);
    const expected = demoParts
      .filter((p) => p.manufacturer === 'Thornbury Power Devices' && p.category === 'mosfet' && p.params.vdsMaxV >= 60)
      .map((p) => p.mpn)
      .sort();
    expect(
      res.body.items
        .map((p: Part) => p.mpn)
        .filter((m: string) => expected.includes(m))
        .sort(),
    ).toEqual(expected);
    for (const p of res.body.items as Part[]) expect(p.category === 'mosfet' && p.params.vdsMaxV >= 60).toBe(true);
  });
});

describe('GET /api/parts refuses bad input, naming the parameter', () => {
  it.each([
    [{ category: 'mosfet', vdsMinV: 'thirty' }, 'vdsMinV'],
    [{ category: 'diode', vdsMinV: 30 }, 'vdsMinV'],
    [{ category: 'mosfet', rdsOnMaxOhm: 0.05 }, 'rdsOnAtVgsV'],
    [{ category: 'valve' }, 'category'],
    [{ pageSize: 1000 }, 'pageSize'],
    [{ page: 0 }, 'page'],
    [{ category: 'diode', sort: 'vdsMaxV' }, 'sort'],
    [{ lifecycle: 'retired' }, 'lifecycle.0'],
    [{ vdsMin: 30 }, '(query)'],
  ])('%j → 400 at %s', async (query, path) => {
    const res = await request(appUrl()).get('/api/parts').query(query).set('Cookie', cookie);
    expect(res.status).toBe(400);
    expect(res.body.error).toEqual(expect.any(String));
    expect(res.body.issues.map((i: { path: string }) => i.path)).toContain(path);
  });

  it('asks for a sign-in first', async () => {
    expect((await request(appUrl()).get('/api/parts')).status).toBe(401);
  });
});

describe('CSV export of a filtered list', () => {
  it('carries exactly the parts of the same filter, in the import format', async () => {
    const query = { category: 'diode', vrrmMinV: 100 };
    const json = await getAll(query);
    const res = await request(appUrl())
      .get('/api/parts.csv')
      .query(query)
      .set('Cookie', cookie)
      .buffer(true)
      .parse((r, cb) => {
        let s = '';
        r.on('data', (c: Buffer) => (s += c.toString('utf8')));
        r.on('end', () => cb(null, s));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="stallpoint-parts-diode-/);
    const lines = (res.body as string).trim().split(/\r\n/);
    const header = lines[0].split(',');
    expect(header.slice(0, 3)).toEqual(['category', 'manufacturer', 'mpn']);
    const mpns = lines
      .slice(1)
      .map((l) => l.split(',')[header.indexOf('mpn')])
      .sort();
    expect(mpns).toEqual(json.map((p) => p.mpn).sort());
    const viaFormat = await request(appUrl())
      .get('/api/parts')
      .query({ ...query, format: 'csv' })
      .set('Cookie', cookie);
    expect(viaFormat.headers['content-type']).toMatch(/^text\/csv/);
  });
});
