/**
 * The match's in-memory candidates (src/server/services/candidate-cache.ts) against a second method: the
 * SQL narrowing and pricing of repos/part-candidates.ts, run on the same database. For a hand-written
 * table of design bounds (supplies, stall currents, gate drives, driver supply bands, picks) and several
 * build quantities, the snapshot gives the same parts, in the same order, with the same parameters,
 * totals and price breaks. The catalogue version (triggers) changes with every committed write to each
 * table the match reads and with nothing else; a stale snapshot is never served.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appDb } from '../helpers/stack.ts';
import { db } from '../../src/server/db.ts';
import {
  candidateLoads,
  candidatesOf,
  candidatesSettled,
  currentCandidates,
  forgetCandidates,
  priceSourcesFrom,
  type CandidateSnapshot,
} from '../../src/server/services/candidate-cache.ts';
import { loadCandidateParts, type CandidateBounds } from '../../src/server/repos/part-candidates.ts';
import { catalogueTriggersInstalled, catalogueVersion } from '../../src/server/repos/catalogue-version.ts';
import { loadCandidates, priceCandidates } from '../../src/server/services/design-candidates.ts';
import { loadDesign } from '../../src/server/repos/designs.ts';
import { resolveMotor } from '../../src/server/services/designs.ts';
import { prepareCase } from '../../src/lib/design-match.ts';

const knex = appDb();
afterAll(async () => {
  await candidatesSettled();
  await knex.destroy();
  await db().destroy();
});

async function freshSnapshot(): Promise<CandidateSnapshot> {
  await candidatesSettled();
  let snapshot = await currentCandidates(db());
  if (!snapshot) {
    await candidatesSettled();
    snapshot = await currentCandidates(db());
  }
  if (!snapshot) throw new Error('no snapshot after a settled load');
  return snapshot;
}

beforeAll(async () => {
  forgetCandidates();
  await freshSnapshot();
});

const bounds = (b: Partial<CandidateBounds>): CandidateBounds => ({
  supplyMaxV: 12,
  stallCurrentMaxA: 3,
  driverSupplyMinV: 10,
  driverSupplyMaxV: 12,
  switchGateMaxV: 3.3,
  switchPickIds: [],
  boardQuantity: 1,
  ...b,
});

// Hand-written: low and high supplies, weak and strong gate drive, heavy stall currents, narrow and
// wide driver supply bands, build quantities across the price breaks (1 to 10,000).
const TABLE: [string, Partial<CandidateBounds>][] = [
  ['12 V fan, 3.3 V pin', {}],
  ['5 V USB, 1.8 V pin', { supplyMaxV: 5.25, stallCurrentMaxA: 1.2, switchGateMaxV: 1.8, driverSupplyMinV: 4.75, driverSupplyMaxV: 5.25 }],
  [
    '24 V at a 12 V driver',
    { supplyMaxV: 26.4, stallCurrentMaxA: 8, switchGateMaxV: 11.3, driverSupplyMinV: 11.4, driverSupplyMaxV: 12.6 },
  ],
  ['48 V, 10 V drive', { supplyMaxV: 52, stallCurrentMaxA: 20, switchGateMaxV: 10, driverSupplyMinV: 9, driverSupplyMaxV: 15 }],
  ['80 V, 2.5 V pin, 250 boards', { supplyMaxV: 80, stallCurrentMaxA: 2, switchGateMaxV: 2.5, boardQuantity: 250 }],
  ['6 V pack, 5 V pin, 1,000 boards', { supplyMaxV: 6.5, stallCurrentMaxA: 4, switchGateMaxV: 5, boardQuantity: 1000 }],
  ['nothing drivable, 10,000 boards', { supplyMaxV: 12, stallCurrentMaxA: 3, switchGateMaxV: 0.5, boardQuantity: 10_000 }],
  ['no rating reaches', { supplyMaxV: 5000, stallCurrentMaxA: 10_000 }],
];

describe('the in-memory candidates', () => {
  it('are only served where the triggers exist', async () => {
    expect(await catalogueTriggersInstalled(knex)).toBe(true);
  });

  for (const [name, b] of TABLE) {
    for (const includePending of [false, true]) {
      it(`${name}${includePending ? ', pending too' : ''}: the same parts, order, totals and prices as the SQL narrowing`, async () => {
        const snapshot = await freshSnapshot();
        const ids: number[] = (await knex('parts').where('category', 'mosfet').orderBy('id').limit(3).select('id')).map(
          (r: { id: number }) => r.id,
        );
        // A pick is kept whatever its gate drive (switchPickIds), in both methods.
        const withPicks = bounds({ ...b, switchPickIds: ids });
        for (const bb of [bounds(b), withPicks]) {
          const sql = await loadCandidateParts(knex, bb, includePending, true);
          const mem = candidatesOf(snapshot, bb, includePending);
          const prices = priceSourcesFrom(
            snapshot,
            [...mem.mosfets, ...mem.drivers, ...mem.diodes].map((p) => p.id as number),
            bb.boardQuantity,
          );
          // Priced copies: the snapshot's parts are frozen.
          const priced = <P extends { id?: number }>(list: P[]) => list.map((p) => ({ ...p, sources: prices.get(p.id as number) ?? [] }));
          expect(mem.totals).toEqual(sql.totals);
          expect(mem.mosfets.map((p) => p.id)).toEqual(sql.mosfets.map((p) => p.id));
          expect(mem.drivers.map((p) => p.id)).toEqual(sql.drivers.map((p) => p.id));
          expect(mem.diodes.map((p) => p.id)).toEqual(sql.diodes.map((p) => p.id));
          expect({ ...mem, mosfets: priced(mem.mosfets), drivers: priced(mem.drivers), diodes: priced(mem.diodes) }).toEqual(sql);
        }
      });
    }
  }

  it('the table bites: some bounds leave parts out, some keep every one, and pending parts differ', async () => {
    const snapshot = await freshSnapshot();
    const sizes = TABLE.map(([, b]) => candidatesOf(snapshot, bounds(b), false).mosfets.length);
    expect(new Set(sizes).size).toBeGreaterThan(3);
    expect(sizes.at(-1)).toBe(0);
    const [{ n }] = await knex('parts')
      .where({ review_status: 'pending' })
      .whereIn('category', ['mosfet', 'driver', 'diode'])
      .count({ n: '*' });
    expect(Number(n)).toBeGreaterThan(0);
    const wide = bounds({ supplyMaxV: 1, stallCurrentMaxA: 0, switchGateMaxV: 100, driverSupplyMinV: 100, driverSupplyMaxV: 0 });
    const all = candidatesOf(snapshot, wide, true);
    const approved = candidatesOf(snapshot, wide, false);
    expect(all.totals.mosfet + all.totals.driver + all.totals.diode).toBeGreaterThan(
      approved.totals.mosfet + approved.totals.driver + approved.totals.diode,
    );
  });

  it('matches share the snapshot’s parts, frozen: a write throws, and pricing one match leaves the snapshot and the next match as they were', async () => {
    const snapshot = await freshSnapshot();
    const a = candidatesOf(snapshot, bounds({}), false);
    expect(() => {
      a.mosfets[0].sources = [{ moq: 1, currency: 'EUR', priceBreaks: [{ qty: 1, unitPrice: 99 }] }];
    }).toThrow(TypeError);
    expect(() => (a.mosfets[0].sources as unknown[]).push(1)).toThrow(TypeError);
    const row = await knex('designs').where('name', 'like', 'BF-12%').first('id');
    const input = (await loadDesign(knex, row.id))!.input;
    const prepared = prepareCase(input, (await resolveMotor(input, knex)).params);
    const priced = await loadCandidates(db(), prepared, false, 'direct', [], 1, false);
    const withSources = priced.mosfets.find((m) => snapshot.sources.has(m.id!))!;
    await priceCandidates(db(), priced, new Set([withSources.id!]), 1);
    const after = priced.mosfets.find((m) => m.id === withSources.id)!;
    expect(after.sources.length).toBeGreaterThan(0);
    expect(Object.isFrozen(after)).toBe(false);
    expect(snapshot.mosfets.find((m) => m.part.id === withSources.id)!.part.sources).toEqual([]);
    const next = await loadCandidates(db(), prepared, false, 'direct', [], 1, false);
    expect(next.mosfets.find((m) => m.id === withSources.id)!.sources).toEqual([]);
  });

  it('a match on the app knex reads only the version once the snapshot is current (no candidate SELECT)', async () => {
    await freshSnapshot();
    const row = await knex('designs').where('name', 'like', 'BF-12%').first('id');
    const input = (await loadDesign(knex, row.id))!.input;
    const prepared = prepareCase(input, (await resolveMotor(input, knex)).params);
    const sqls: string[] = [];
    const listen = (q: { sql: string }) => sqls.push(q.sql);
    db().on('query', listen);
    try {
      const fromMemory = await loadCandidates(db(), prepared, false, 'direct', [], input.boardQuantity, true);
      expect(sqls.length).toBe(1);
      expect(sqls[0]).toContain('catalogue_version');
      const fromSql = await loadCandidates(knex, prepared, false, 'direct', [], input.boardQuantity, true);
      expect(fromMemory).toEqual(fromSql);
    } finally {
      db().off('query', listen);
    }
  });
});

describe('the catalogue version', () => {
  const mosfetId = async (): Promise<number> => (await knex('parts').where('category', 'mosfet').orderBy('id').first('id')).id;

  // One committed write per table and kind of statement the match reads; each must change the version.
  const WRITES: [string, () => Promise<unknown>][] = [
    [
      'parts update',
      async () =>
        knex('parts')
          .where({ id: await mosfetId() })
          .update({ description: knex.raw("CONCAT(description, ' ')") }),
    ],
    [
      'mosfet_params update',
      async () =>
        knex('mosfet_params')
          .where({ part_id: await mosfetId() })
          .increment('qg_total_nc', 0.5),
    ],
    [
      'mosfet_rds_on_points update',
      async () =>
        knex('mosfet_rds_on_points')
          .where({ part_id: await mosfetId() })
          .increment('max_ohm', 0.0001),
    ],
    [
      'mosfet_zth_points insert',
      async () => knex('mosfet_zth_points').insert({ part_id: await mosfetId(), pulse_s: 123.456, zth_c_per_w: 50 }),
    ],
    [
      'mosfet_zth_points delete',
      async () =>
        knex('mosfet_zth_points')
          .where({ part_id: await mosfetId(), pulse_s: 123.456 })
          .delete(),
    ],
    ['driver_params update', async () => knex('driver_params').orderBy('part_id').limit(1).increment('propagation_delay_ns', 1)],
    ['diode_params update', async () => knex('diode_params').orderBy('part_id').limit(1).increment('trr_ns', 0)],
    ['part_sources update', async () => knex('part_sources').orderBy('id').limit(1).increment('moq', 0)],
    ['part_price_breaks update', async () => knex('part_price_breaks').orderBy('id').limit(1).increment('unit_price', 0.001)],
  ];

  for (const [name, write] of WRITES) {
    it(`changes with a committed ${name}`, async () => {
      const before = await catalogueVersion(knex);
      await write();
      expect(await catalogueVersion(knex)).not.toBe(before);
    });
  }

  it('stays the same over reads and over a write that is rolled back', async () => {
    const before = await catalogueVersion(knex);
    await knex('parts').count({ n: '*' });
    await knex
      .transaction(async (trx) => {
        await trx('mosfet_params')
          .where({ part_id: await mosfetId() })
          .increment('qg_total_nc', 1);
        throw new Error('roll back');
      })
      .catch(() => undefined);
    expect(await catalogueVersion(knex)).toBe(before);
  });

  it('a changed part is never served from the old snapshot: the match narrows in SQL, then the new snapshot has it', async () => {
    const snapshot = await freshSnapshot();
    const loads = candidateLoads();
    const b = bounds({});
    const id = candidatesOf(snapshot, b, false).mosfets[0].id as number;
    // Its VDS(max) drops below the supply: it can no longer be a candidate at these bounds.
    await knex('mosfet_params').where({ part_id: id }).update({ vds_max_v: 8 });
    expect(await currentCandidates(db())).toBeNull();
    const next = await freshSnapshot();
    expect(candidateLoads()).toBe(loads + 1);
    expect(next.mosfets.find((m) => m.part.id === id)?.part.params.vdsMaxV).toBe(8);
    expect(candidatesOf(next, b, false).mosfets.map((p) => p.id)).not.toContain(id);
    expect(candidatesOf(next, b, false)).toEqual(await loadCandidateParts(knex, b, false, false));
  });
});
