/**
 * The catalogue candidates of a design, narrowed in SQL on indexed rating columns: only parts whose
 * ratings or gate-drive needs can never pass are left out (the engineering core would fail them on a
 * hard limit), with
 * obsolete parts (not for new designs) and parts not yet approved unless asked for.
 */
import { eachInTurns, nextTurn } from '../turns.ts';
import { PriceTable, type SourceBreaks } from './price-table.ts';
import type { Db } from '../db.ts';
import type { CandidatePart, PartCategory, PriceSource } from '../../lib/domain/parts.ts';
import { diodeFromRow, driverFromRow, mosfetFromRows } from './part-mapping.ts';
import type { DbDiodeRow, DbDriverRow, DbMosfetRow, DbPartRow, DbRdsOnRow, DbZthRow } from './part-rows.ts';

/** The hard limits a candidate's ratings must reach (from the design's worst case). */
export interface CandidateBounds {
  /** Highest supply: a MOSFET's VDS(max) and a diode's VRRM must reach it. */
  supplyMaxV: number;
  /** Highest stall current: a MOSFET's pulsed drain current must reach it. */
  stallCurrentMaxA: number;
  /** The driver supply band: a driver's supply range must cover it. */
  driverSupplyMinV: number;
  driverSupplyMaxV: number;
  /**
   * The highest gate voltage the switch can see (the pin's logic high for direct drive, the driver
   * supply's top for a driver): a MOSFET whose lowest RDS(on) line or VGS(th) max lies above it fails
   * the gate-drive check at any drive there is, so it is left out. The picks are kept regardless.
   */
  switchGateMaxV: number;
  /** The design's switch picks: ranked whenever their ratings allow, whatever the gate drive. */
  switchPickIds: number[];
  /** The build quantity: each source comes with the one price break that applies at it. */
  boardQuantity: number;
}

export interface CandidateRows {
  mosfets: CandidatePart<'mosfet'>[];
  drivers: CandidatePart<'driver'>[];
  diodes: CandidatePart<'diode'>[];
  /** Eligible parts of each category before the rating bounds (for "n left out"). */
  totals: { mosfet: number; driver: number; diode: number };
}

function eligible(db: Db, category: string, includePending: boolean) {
  return db<DbPartRow>('parts')
    .where('parts.category', category)
    .whereIn('parts.review_status', includePending ? ['approved', 'pending'] : ['approved'])
    .whereNot('parts.lifecycle', 'obsolete');
}

async function countOf(q: ReturnType<typeof eligible>): Promise<number> {
  const [{ n }] = await q.clone().clearSelect().count({ n: '*' });
  return Number(n);
}

/** The columns of `parts` the match needs (no description, dates or audit columns). */
const HEAD_COLUMNS = [
  'parts.id',
  'parts.category',
  'parts.manufacturer',
  'parts.mpn',
  'parts.package',
  'parts.lifecycle',
  'parts.review_status',
];

type HeadRow = Pick<DbPartRow, 'id' | 'manufacturer' | 'mpn' | 'package' | 'lifecycle' | 'review_status'>;

/**
 * The three candidate SELECTs: the head columns the match needs and the category's parameter row, one
 * row per part (the benchmark times them bare against the whole match).
 */
export function candidateQueries(db: Db, bounds: CandidateBounds, includePending: boolean) {
  const mosfetAll = eligible(db, 'mosfet', includePending);
  const mosfetQ = mosfetAll
    .clone()
    .join('mosfet_params', 'mosfet_params.part_id', 'parts.id')
    .where('mosfet_params.channel', 'n')
    .where('mosfet_params.vds_max_v', '>=', bounds.supplyMaxV)
    .where('mosfet_params.id_pulsed_a', '>=', bounds.stallCurrentMaxA)
    .where((w) =>
      w
        .where((g) =>
          g
            .where('mosfet_params.min_rds_on_vgs_v', '<=', bounds.switchGateMaxV)
            .where('mosfet_params.vgs_th_max_v', '<=', bounds.switchGateMaxV),
        )
        .orWhereIn('parts.id', bounds.switchPickIds),
    )
    .select('mosfet_params.*', ...HEAD_COLUMNS)
    .orderBy('parts.id');
  const driverAll = eligible(db, 'driver', includePending);
  const driverQ = driverAll
    .clone()
    .join('driver_params', 'driver_params.part_id', 'parts.id')
    .where('driver_params.supply_min_v', '<=', bounds.driverSupplyMinV)
    .where('driver_params.supply_max_v', '>=', bounds.driverSupplyMaxV)
    .select('driver_params.*', ...HEAD_COLUMNS)
    .orderBy('parts.id');
  const diodeAll = eligible(db, 'diode', includePending);
  const diodeQ = diodeAll
    .clone()
    .join('diode_params', 'diode_params.part_id', 'parts.id')
    .where('diode_params.vrrm_v', '>=', bounds.supplyMaxV)
    .select('diode_params.*', ...HEAD_COLUMNS)
    .orderBy('parts.id');
  return { mosfetAll, mosfetQ, driverAll, driverQ, diodeAll, diodeQ };
}

type Query = ReturnType<typeof candidateQueries>['mosfetQ'];
const idsOf = (q: Query) => q.clone().clearSelect().clearOrder().select('parts.id');

function groupBy<T>(rows: T[], key: (r: T) => number): Map<number, T[]> {
  const map = new Map<number, T[]>();
  for (const r of rows) pushTo(map, key(r), r);
  return map;
}

interface PriceRow {
  part_id: number;
  source_id: number;
  moq: number;
  currency: string;
  qty: number;
  unit_price: number | string;
}

/**
 * The price of the parts a query selects at a quantity: per source only the break that applies there
 * (the largest at or below the quantity or the source's MOQ, whichever is higher), sources in id order as
 * the part record has them, so bestUnitPrice at that quantity gives what it gives on the full record.
 */
async function priceSourcesOf(db: Db, q: Query | readonly number[], qty: number): Promise<Map<number, PriceSource[]>> {
  const rows: PriceRow[] = await db('part_sources')
    .join('part_price_breaks', 'part_price_breaks.source_id', 'part_sources.id')
    .whereIn('part_sources.part_id', Array.isArray(q) ? q : idsOf(q as Query))
    .where(
      'part_price_breaks.qty',
      db('part_price_breaks as b2')
        .max('b2.qty')
        .whereRaw('b2.source_id = part_sources.id')
        .whereRaw('b2.qty <= greatest(?, part_sources.moq)', [qty]),
    )
    .select(
      'part_sources.part_id',
      'part_sources.id as source_id',
      'part_sources.moq',
      'part_sources.currency',
      'part_price_breaks.qty',
      'part_price_breaks.unit_price',
    )
    .orderBy('part_sources.id');
  const out = new Map<number, PriceSource[]>();
  let sourceId = -1;
  let source: PriceSource = { moq: 0, currency: '', priceBreaks: [] };
  for (const r of rows) {
    if (r.source_id !== sourceId) {
      sourceId = r.source_id;
      source = { moq: r.moq, currency: r.currency, priceBreaks: [] };
      const list = out.get(r.part_id);
      if (list) list.push(source);
      else out.set(r.part_id, [source]);
    }
    source.priceBreaks.push({ qty: r.qty, unitPrice: Number(r.unit_price) });
  }
  return out;
}

function head<C extends PartCategory>(category: C, r: HeadRow, sources: Map<number, PriceSource[]>, same: Interner = (x) => x) {
  return {
    id: r.id,
    category,
    manufacturer: same(r.manufacturer),
    mpn: r.mpn,
    package: same(r.package),
    lifecycle: same(r.lifecycle),
    reviewStatus: same(r.review_status),
    sources: sources.get(r.id) ?? [],
  };
}

type Interner = <S extends string>(text: S) => S;

/**
 * One string object per distinct text: the database driver makes a new string for every row, and the
 * candidate cache keeps 67,000 parts that share a few dozen makers, packages and states.
 */
function interner(): Interner {
  const seen = new Map<string, string>();
  return <S extends string>(text: S): S => {
    const known = seen.get(text);
    if (known !== undefined) return known as S;
    seen.set(text, text);
    return text;
  };
}

const PRICE_IDS_PER_QUERY = 5000;

/**
 * The price break that applies at `qty` for each source of the given parts (as loadCandidateParts gives
 * them), in batches of ids; parts without sources are absent from the map.
 */
export async function candidatePriceSources(db: Db, partIds: readonly number[], qty: number): Promise<Map<number, PriceSource[]>> {
  const out = new Map<number, PriceSource[]>();
  for (let i = 0; i < partIds.length; i += PRICE_IDS_PER_QUERY) {
    for (const [id, sources] of await priceSourcesOf(db, partIds.slice(i, i + PRICE_IDS_PER_QUERY), qty)) out.set(id, sources);
  }
  return out;
}

const NO_PRICES: Promise<Map<number, PriceSource[]>> = Promise.resolve(new Map());

/**
 * The candidates as the match ranks them: one SELECT per category for head and parameters, the MOSFETs'
 * RDS(on) and Zth points and (unless `prices` is false: then every part comes with no sources, for
 * candidatePriceSources to fill in where a price can show) everyone's price breaks through the same
 * narrowing (no list of ids sent).
 */
export async function loadCandidateParts(db: Db, bounds: CandidateBounds, includePending: boolean, prices = true): Promise<CandidateRows> {
  const { mosfetAll, mosfetQ, driverAll, driverQ, diodeAll, diodeQ } = candidateQueries(db, bounds, includePending);
  const [mosfetRows, driverRows, diodeRows, points, zth, mosfetPrices, driverPrices, diodePrices, mosfet, driver, diode] =
    await Promise.all([
      mosfetQ as Promise<(HeadRow & DbMosfetRow)[]>,
      driverQ as Promise<(HeadRow & DbDriverRow)[]>,
      diodeQ as Promise<(HeadRow & DbDiodeRow)[]>,
      db<DbRdsOnRow>('mosfet_rds_on_points')
        .whereIn('part_id', idsOf(mosfetQ))
        .select('part_id', 'vgs_v', 'tj_c', 'max_ohm', 'typ_ohm', 'id_a') as Promise<DbRdsOnRow[]>,
      db<DbZthRow>('mosfet_zth_points').whereIn('part_id', idsOf(mosfetQ)).select('part_id', 'pulse_s', 'zth_c_per_w') as Promise<
        DbZthRow[]
      >,
      prices ? priceSourcesOf(db, mosfetQ, bounds.boardQuantity) : NO_PRICES,
      prices ? priceSourcesOf(db, driverQ, bounds.boardQuantity) : NO_PRICES,
      prices ? priceSourcesOf(db, diodeQ, bounds.boardQuantity) : NO_PRICES,
      countOf(mosfetAll),
      countOf(driverAll),
      countOf(diodeAll),
    ]);
  const pointsById = groupBy(points, (p) => p.part_id);
  const zthById = groupBy(zth, (p) => p.part_id);
  return {
    mosfets: mosfetRows.map((r) => ({
      ...head('mosfet', r, mosfetPrices),
      params: mosfetFromRows(r, pointsById.get(r.id) ?? [], zthById.get(r.id) ?? []),
    })),
    drivers: driverRows.map((r) => ({ ...head('driver', r, driverPrices), params: driverFromRow(r) })),
    diodes: diodeRows.map((r) => ({ ...head('diode', r, diodePrices), params: diodeFromRow(r) })),
    totals: { mosfet, driver, diode },
  };
}

/** A source with every price break, as the in-memory candidates keep it (breaks by rising quantity). */
export type { SourceBreaks };

/** Every part the match may rank, whatever the design: MOSFETs, drivers and diodes not obsolete, approved or pending. */
export interface WholeCandidateRows {
  mosfets: { part: CandidatePart<'mosfet'>; minRdsOnVgsV: number }[];
  drivers: CandidatePart<'driver'>[];
  diodes: CandidatePart<'diode'>[];
  /** Sources per part id, in source id order (packed: see PriceTable). */
  sources: PriceTable;
}

function wholeOf(db: Db, category: string) {
  return db<DbPartRow>('parts')
    .where('parts.category', category)
    .whereIn('parts.review_status', ['approved', 'pending'])
    .whereNot('parts.lifecycle', 'obsolete');
}

/** The rows of the whole candidate catalogue as the database gives them (readWholeCandidateRows). */
export type WholeCandidateRawRows = Awaited<ReturnType<typeof readWholeCandidateRows>>;

/**
 * The whole candidate catalogue for the match's in-memory candidates, in two steps: these queries in the
 * caller's transaction (one snapshot, with the version read there too), then wholeCandidatesFromRows
 * after it. Parts come with no sources; `sources` has them all.
 */
export async function readWholeCandidateRows(trx: Db) {
  const ids = (category: string) => wholeOf(trx, category).select('parts.id');
  const mosfetRows = (await wholeOf(trx, 'mosfet')
    .join('mosfet_params', 'mosfet_params.part_id', 'parts.id')
    .select('mosfet_params.*', ...HEAD_COLUMNS)
    .orderBy('parts.id')) as (HeadRow & DbMosfetRow)[];
  const points = (await trx<DbRdsOnRow>('mosfet_rds_on_points')
    .whereIn('part_id', ids('mosfet'))
    .select('part_id', 'vgs_v', 'tj_c', 'max_ohm', 'typ_ohm', 'id_a')) as DbRdsOnRow[];
  const zth = (await trx<DbZthRow>('mosfet_zth_points')
    .whereIn('part_id', ids('mosfet'))
    .select('part_id', 'pulse_s', 'zth_c_per_w')) as DbZthRow[];
  const driverRows = (await wholeOf(trx, 'driver')
    .join('driver_params', 'driver_params.part_id', 'parts.id')
    .select('driver_params.*', ...HEAD_COLUMNS)
    .orderBy('parts.id')) as (HeadRow & DbDriverRow)[];
  const diodeRows = (await wholeOf(trx, 'diode')
    .join('diode_params', 'diode_params.part_id', 'parts.id')
    .select('diode_params.*', ...HEAD_COLUMNS)
    .orderBy('parts.id')) as (HeadRow & DbDiodeRow)[];
  const breakRows: PriceRow[] = await trx('part_sources')
    .join('part_price_breaks', 'part_price_breaks.source_id', 'part_sources.id')
    .join('parts', 'parts.id', 'part_sources.part_id')
    .whereIn('parts.category', ['mosfet', 'driver', 'diode'])
    .whereIn('parts.review_status', ['approved', 'pending'])
    .whereNot('parts.lifecycle', 'obsolete')
    .select(
      'part_sources.part_id',
      'part_sources.id as source_id',
      'part_sources.moq',
      'part_sources.currency',
      'part_price_breaks.qty',
      'part_price_breaks.unit_price',
    )
    .orderBy([{ column: 'part_sources.id' }, { column: 'part_price_breaks.qty' }]);
  return { mosfetRows, points, zth, driverRows, diodeRows, breakRows };
}

/**
 * The rows turned into parts in slices, a turn of the event loop between them (src/server/turns.ts):
 * this runs in the background after every catalogue change, and in one go it held every request for
 * 0.4–0.5 s at 67,000 parts. No transaction is held meanwhile (the rows are read already).
 */
export async function wholeCandidatesFromRows({
  mosfetRows,
  points,
  zth,
  driverRows,
  diodeRows,
  breakRows,
}: WholeCandidateRawRows): Promise<WholeCandidateRows> {
  const sources = new Map<number, SourceBreaks[]>();
  let sourceId = -1;
  let source: SourceBreaks = { moq: 0, currency: '', breaks: [] };
  await inTurns(breakRows, (r) => {
    if (r.source_id !== sourceId) {
      sourceId = r.source_id;
      source = { moq: r.moq, currency: r.currency, breaks: [] };
      const list = sources.get(r.part_id);
      if (list) list.push(source);
      else sources.set(r.part_id, [source]);
    }
    source.breaks.push({ qty: r.qty, unitPrice: Number(r.unit_price) });
  });
  const none = new Map<number, PriceSource[]>();
  const same = interner();
  const pointsById = new Map<number, DbRdsOnRow[]>();
  await inTurns(points, (p) => pushTo(pointsById, p.part_id, p));
  const zthById = new Map<number, DbZthRow[]>();
  await inTurns(zth, (p) => pushTo(zthById, p.part_id, p));
  const mosfets: WholeCandidateRows['mosfets'] = [];
  await inTurns(mosfetRows, (r) =>
    mosfets.push({
      part: { ...head('mosfet', r, none, same), params: mosfetFromRows(r, pointsById.get(r.id) ?? [], zthById.get(r.id) ?? []) },
      minRdsOnVgsV: r.min_rds_on_vgs_v,
    }),
  );
  const drivers: WholeCandidateRows['drivers'] = [];
  await inTurns(driverRows, (r) => drivers.push({ ...head('driver', r, none, same), params: driverFromRow(r) }));
  const diodes: WholeCandidateRows['diodes'] = [];
  await inTurns(diodeRows, (r) => diodes.push({ ...head('diode', r, none, same), params: diodeFromRow(r) }));
  await nextTurn();
  return { mosfets, drivers, diodes, sources: new PriceTable(sources) };
}

/** Rows handled per turn of the event loop while the whole candidate catalogue is read (a few ms each). */
const ROWS_PER_TURN = 5_000;

const inTurns = <T>(rows: readonly T[], each: (row: T) => void): Promise<void> => eachInTurns(rows, each, ROWS_PER_TURN);

function pushTo<T>(map: Map<number, T[]>, key: number, value: T): void {
  const list = map.get(key);
  if (list) list.push(value);
  else map.set(key, [value]);
}
