/**
 * SQL for the catalogue list: every parameter filter runs on the typed, indexed columns of the
 * category tables. The rules, in one place (README "Searching the catalogue" repeats them):
 *  - RDS(on) ≤ X at VGS = V: among the part's 25 °C RDS(on) lines, take the one at the highest VGS not
 *    above V; its maximum must be ≤ X. RDS(on) falls as VGS rises, so that line bounds the resistance at
 *    the drive from above without interpolating. A part with no line at or below V is not characterised
 *    at that drive and is left out. `rdsOnAtVgsV` alone keeps the parts characterised at or below V.
 *  - Driver supply S (`supplyV`) must lie inside the supply range. Output high = S − output drop ≥
 *    `outputHighMinV`, with S the highest rated supply when no supplyV is given.
 *  - Driver input compatible with a logic rail L (`logicRailV`, logic high taken as L): fixed thresholds
 *    VIH ≤ L; supply-ratio thresholds VIH·S ≤ L with S = supplyV or else the lowest rated supply;
 *    input-rail translators (thresholds a fraction of L) always.
 *  - Diode `trrMaxNs`: trr ≤ X, and Schottky parts without a trr (no stored charge) pass.
 */
import type { Knex } from 'knex';
import type { Db } from '../db.ts';
import type { PartListQuery } from '../../lib/schemas/parts.ts';
import type { PartCategory } from '../../lib/domain/parts.ts';

const PARAM_TABLE: Record<PartCategory, { table: string; alias: string }> = {
  mosfet: { table: 'mosfet_params', alias: 'm' },
  driver: { table: 'driver_params', alias: 'd' },
  diode: { table: 'diode_params', alias: 'g' },
  motor: { table: 'motor_params', alias: 'w' },
};

const SORT_COLUMNS: Record<string, string> = {
  mpn: 'parts.mpn',
  manufacturer: 'parts.manufacturer',
  package: 'parts.package',
  lifecycle: 'parts.lifecycle',
  reviewStatus: 'parts.review_status',
  updatedAt: 'parts.updated_at',
  vdsMaxV: 'm.vds_max_v',
  vgsThMaxV: 'm.vgs_th_max_v',
  idContinuousA: 'm.id_continuous_a',
  qgTotalNc: 'm.qg_total_nc',
  rthJaCPerW: 'm.rth_ja_c_per_w',
  minRdsOnVgsV: 'm.min_rds_on_vgs_v',
  supplyMinV: 'd.supply_min_v',
  supplyMaxV: 'd.supply_max_v',
  sourceCurrentA: 'd.source_current_a',
  propagationDelayNs: 'd.propagation_delay_ns',
  vrrmV: 'g.vrrm_v',
  ifAvA: 'g.if_av_a',
  vfV: 'g.vf_v',
  trrNs: 'g.trr_ns',
  ratedVoltageV: 'w.rated_voltage_v',
  noLoadSpeedRpm: 'w.no_load_speed_rpm',
  stallTorqueNm: 'w.stall_torque_nm',
  stallCurrentA: 'w.stall_current_a',
};

/** Both halves of the RDS(on) bound are given (the filter that reads mosfet_rds_on_governing). */
const hasRdsOnBound = (f: PartListQuery): boolean => f.category === 'mosfet' && f.rdsOnAtVgsV !== undefined && f.rdsOnMaxOhm !== undefined;

/** The one governing interval of a part that holds the drive, with its maximum within the bound. */
function governingHoldsDrive(q: Knex.QueryBuilder, f: PartListQuery): void {
  q.where('gv.vgs_from_v', '<=', f.rdsOnAtVgsV!)
    .where((w) => w.whereNull('gv.vgs_to_v').orWhere('gv.vgs_to_v', '>', f.rdsOnAtVgsV!))
    .where('gv.max_ohm', '<=', f.rdsOnMaxOhm!);
}

function mosfetFilters(q: Knex.QueryBuilder, f: PartListQuery, governingJoined: boolean): void {
  if (f.channel) q.where('m.channel', f.channel);
  if (f.vdsMinV !== undefined) q.where('m.vds_max_v', '>=', f.vdsMinV);
  if (f.vgsThMaxV !== undefined) q.where('m.vgs_th_max_v', '<=', f.vgsThMaxV);
  if (f.idMinA !== undefined) q.where('m.id_continuous_a', '>=', f.idMinA);
  if (f.qgMaxNc !== undefined) q.where('m.qg_total_nc', '<=', f.qgMaxNc);
  if (f.rdsOnAtVgsV !== undefined && f.rdsOnMaxOhm === undefined) q.where('m.min_rds_on_vgs_v', '<=', f.rdsOnAtVgsV);
  if (hasRdsOnBound(f) && !governingJoined) {
    // The governing line per VGS interval (mosfet_rds_on_governing, src/lib/rdson-governing.ts): at most one
    // interval of a part holds the drive, so this reads one row by primary key per candidate part.
    q.whereExists((x) => {
      x.select(x.client.raw('1')).from('mosfet_rds_on_governing as gv').whereRaw('gv.part_id = parts.id');
      governingHoldsDrive(x, f);
    });
  }
}

function driverFilters(q: Knex.QueryBuilder, f: PartListQuery): void {
  if (f.inverting !== undefined) q.where('d.inverting', f.inverting);
  if (f.supplyV !== undefined) q.where('d.supply_min_v', '<=', f.supplyV).where('d.supply_max_v', '>=', f.supplyV);
  if (f.outputHighMinV !== undefined) {
    if (f.supplyV !== undefined) q.whereRaw('? - d.output_high_drop_v >= ?', [f.supplyV, f.outputHighMinV]);
    else q.whereRaw('d.supply_max_v - d.output_high_drop_v >= ?', [f.outputHighMinV]);
  }
  if (f.logicRailV !== undefined) {
    const ratioSupply = f.supplyV !== undefined ? '?' : 'd.supply_min_v';
    const ratioBindings = f.supplyV !== undefined ? [f.supplyV, f.logicRailV] : [f.logicRailV];
    q.where((w) =>
      w
        .where((x) => x.where('d.input_logic', 'fixed').where('d.input_high_min', '<=', f.logicRailV!))
        .orWhere((x) => x.where('d.input_logic', 'ratio').whereRaw(`d.input_high_min * ${ratioSupply} <= ?`, ratioBindings))
        .orWhere((x) => x.where('d.input_logic', 'input-rail').where('d.input_high_min', '<=', 1)),
    );
  }
}

function diodeFilters(q: Knex.QueryBuilder, f: PartListQuery): void {
  if (f.kind) q.where('g.kind', f.kind);
  if (f.vrrmMinV !== undefined) q.where('g.vrrm_v', '>=', f.vrrmMinV);
  if (f.ifAvMinA !== undefined) q.where('g.if_av_a', '>=', f.ifAvMinA);
  if (f.trrMaxNs !== undefined) {
    q.where((w) => w.where('g.trr_ns', '<=', f.trrMaxNs!).orWhere((x) => x.whereNull('g.trr_ns').where('g.kind', 'schottky')));
  }
}

function motorFilters(q: Knex.QueryBuilder, f: PartListQuery): void {
  if (f.ratedVoltageMinV !== undefined) q.where('w.rated_voltage_v', '>=', f.ratedVoltageMinV);
  if (f.ratedVoltageMaxV !== undefined) q.where('w.rated_voltage_v', '<=', f.ratedVoltageMaxV);
  if (f.noLoadSpeedMinRpm !== undefined) q.where('w.no_load_speed_rpm', '>=', f.noLoadSpeedMinRpm);
  if (f.stallTorqueMinNm !== undefined) q.where('w.stall_torque_nm', '>=', f.stallTorqueMinNm);
}

/** Who is looking: without approvedOrOwnedBy every part; with it, approved parts and that user's own. */
export interface PartScope {
  approvedOrOwnedBy?: number;
}
/** A list query with the viewer's scope (services/parts-access.ts listingScope). */
export type ScopedPartQuery = PartListQuery & PartScope;

/**
 * parts joined to the category table (when a category is chosen), with every filter of the query applied.
 * `driveFromRdsOn` (the plain parameter list, no text): with an RDS(on) bound the statement starts from
 * the governing intervals that hold the drive within the bound (a covering index range, rds_gov_cover_idx)
 * and then reads the MOSFET and the part by primary key, in that order (STRAIGHT_JOIN: the optimizer
 * cannot estimate the interval condition and would otherwise read every MOSFET of the channel and voltage
 * first, about five times the rows at catalogue size; measured in scripts/bench/profile-search.ts). The
 * intervals of a part do not overlap, so the join yields each part at most once, as the EXISTS form does.
 * Not for text search: there FULLTEXT must lead.
 */
export function filteredParts(db: Db, f: ScopedPartQuery, options: { driveFromRdsOn?: boolean } = {}): Knex.QueryBuilder {
  const governingJoined = options.driveFromRdsOn === true && hasRdsOnBound(f);
  const q = governingJoined
    ? db('mosfet_rds_on_governing as gv')
        .joinRaw('straight_join mosfet_params as m on m.part_id = gv.part_id')
        .joinRaw('straight_join parts on parts.id = gv.part_id')
        .where('parts.category', 'mosfet')
    : db('parts');
  if (governingJoined) {
    governingHoldsDrive(q, f);
    mosfetFilters(q, f, true);
  } else if (f.category) {
    const { table, alias } = PARAM_TABLE[f.category];
    q.join(`${table} as ${alias}`, `${alias}.part_id`, 'parts.id').where('parts.category', f.category);
    if (f.category === 'mosfet') mosfetFilters(q, f, false);
    else ({ driver: driverFilters, diode: diodeFilters, motor: motorFilters })[f.category](q, f);
  }
  if (f.lifecycle?.length) q.whereIn('parts.lifecycle', f.lifecycle);
  if (f.reviewStatus?.length) q.whereIn('parts.review_status', f.reviewStatus);
  const owner = f.approvedOrOwnedBy;
  if (owner !== undefined) q.where((w) => w.where('parts.review_status', 'approved').orWhere('parts.created_by', owner));
  if (f.package) q.where('parts.package', f.package);
  return q;
}

/** Applies the requested sort (validated against the category by the schema), then a stable tie-break. */
export function applySort(q: Knex.QueryBuilder, sort: string | undefined): Knex.QueryBuilder {
  const desc = sort?.startsWith('-') ?? false;
  const column = sort ? SORT_COLUMNS[sort.replace(/^-/, '')] : undefined;
  if (column) q.orderByRaw(`${column} is null, ${column} ${desc ? 'desc' : 'asc'}`);
  if (!sort) q.orderBy([{ column: 'parts.category' }, { column: 'parts.manufacturer' }]);
  return q.orderBy([{ column: 'parts.mpn' }, { column: 'parts.id' }]);
}

export async function countFiltered(db: Db, f: ScopedPartQuery): Promise<number> {
  const row = await filteredParts(db, f, { driveFromRdsOn: true }).count({ n: 'parts.id' }).first();
  return Number(row?.n ?? 0);
}

export interface SearchTextRow {
  id: number;
  manufacturer: string;
  mpn: string;
  description: string;
}

/** A part number as the search compares it (the parts.mpn_norm column: upper case, letters and digits). */
export const normalizeMpn = (text: string): string => text.toUpperCase().replace(/[^A-Z0-9]/g, '');

/** Rows each lookup of the text search contributes at most. */
export const TEXT_LOOKUP_ROWS = 200;

/**
 * The candidates of a text search, from indexed lookups only (never a scan of the catalogue), each
 * within the query's filters: the normalised part number exactly, as a prefix, by its first half and by
 * its second half (the halves do not overlap, so one wrong character leaves the other half intact), and the words of maker and
 * description by FULLTEXT, also by their first four letters (a typo after them is still found).
 * The rows come back with `exact` set for an exact part number. fuse.js orders them afterwards.
 */
export async function textCandidates(db: Db, f: ScopedPartQuery, text: string): Promise<(SearchTextRow & { exact: boolean })[]> {
  const n = normalizeMpn(text);
  const base = () =>
    filteredParts(db, f)
      .select('parts.id', 'parts.manufacturer', 'parts.mpn', 'parts.description', 'parts.mpn_norm')
      .limit(TEXT_LOOKUP_ROWS);
  const lookups: Knex.QueryBuilder[] = [];
  if (n.length > 0) lookups.push(base().where('parts.mpn_norm', n));
  if (n.length >= 2) lookups.push(base().where('parts.mpn_norm', 'like', `${n}%`).orderBy('parts.mpn_norm'));
  if (n.length >= 6) {
    const half = Math.ceil(n.length / 2);
    lookups.push(
      base()
        .where('parts.mpn_norm', 'like', `${n.slice(0, half)}%`)
        .orderBy('parts.mpn_norm'),
    );
    lookups.push(
      base()
        .where('parts.mpn_rev', 'like', `${[...n.slice(half)].reverse().join('')}%`)
        .orderBy('parts.mpn_rev'),
    );
  }
  const words = text
    .toLowerCase()
    .split(/[^\p{L}\p{N}]+/u)
    .filter((w) => w.length >= 3);
  if (words.length) {
    lookups.push(base().whereRaw('MATCH(parts.manufacturer, parts.description) AGAINST (? IN NATURAL LANGUAGE MODE)', [words.join(' ')]));
    const stems = words.filter((w) => w.length >= 4).map((w) => `${w.slice(0, 4)}*`);
    if (stems.length)
      lookups.push(base().whereRaw('MATCH(parts.manufacturer, parts.description) AGAINST (? IN BOOLEAN MODE)', [stems.join(' ')]));
  }
  const results = (await Promise.all(lookups)) as (SearchTextRow & { mpn_norm: string })[][];
  const seen = new Map<number, SearchTextRow & { exact: boolean }>();
  for (const rows of results) {
    for (const r of rows) {
      if (!seen.has(r.id))
        seen.set(r.id, { id: r.id, manufacturer: r.manufacturer, mpn: r.mpn, description: r.description, exact: r.mpn_norm === n });
    }
  }
  return [...seen.values()];
}

/** The given ids in the query's sort order. */
export async function sortIds(db: Db, f: ScopedPartQuery, ids: number[]): Promise<number[]> {
  if (ids.length === 0) return [];
  const rows: { id: number }[] = await applySort(filteredParts(db, f).select('parts.id').whereIn('parts.id', ids), f.sort);
  return rows.map((r) => r.id);
}

/** Id and text of every part the filters keep, in sort order (the input of the fuzzy text match). */
export async function filteredTextRows(db: Db, f: ScopedPartQuery, limit: number): Promise<SearchTextRow[]> {
  const q = filteredParts(db, f).select('parts.id', 'parts.manufacturer', 'parts.mpn', 'parts.description');
  return applySort(q, f.sort).limit(limit);
}

/**
 * One page of part ids in sort order and the number of parts the filters keep, in one statement (a window
 * count over the filtered rows, taken before the LIMIT). A page past the end has no row to carry the
 * count, so only then a second statement counts.
 */
export async function filteredPageAndCount(
  db: Db,
  f: ScopedPartQuery,
  offset: number,
  limit: number,
): Promise<{ ids: number[]; total: number }> {
  const rows: { id: number; total: number | string }[] = await applySort(
    filteredParts(db, f, { driveFromRdsOn: true }).select('parts.id', db.raw('count(*) over () as total')),
    f.sort,
  )
    .offset(offset)
    .limit(limit);
  if (rows.length === 0) return { ids: [], total: offset === 0 ? 0 : await countFiltered(db, f) };
  return { ids: rows.map((r) => r.id), total: Number(rows[0].total) };
}

/** One page of part ids in sort order. */
export async function filteredIdsPage(db: Db, f: ScopedPartQuery, offset: number, limit: number): Promise<number[]> {
  const rows: { id: number }[] = await applySort(filteredParts(db, f, { driveFromRdsOn: true }).select('parts.id'), f.sort)
    .offset(offset)
    .limit(limit);
  return rows.map((r) => r.id);
}

/** A part waiting for review, with who proposed it. */
export interface ReviewQueueItem {
  id: number;
  category: string;
  manufacturer: string;
  mpn: string;
  description: string;
  status: string;
  proposer: string | null;
  createdAt: string;
  version: number;
}

/** Parts waiting for review, oldest first, with who proposed them. */
export async function listReviewQueue(db: Db): Promise<ReviewQueueItem[]> {
  const rows = await db('parts as p')
    .leftJoin('users as u', 'u.id', 'p.created_by')
    .select(
      'p.id',
      'p.category',
      'p.manufacturer',
      'p.mpn',
      'p.description',
      'p.review_status',
      'p.created_at',
      'p.version',
      'u.name as proposer',
    )
    .whereIn('p.review_status', ['pending'])
    .orderBy([{ column: 'p.created_at' }, { column: 'p.id' }]);
  return rows.map((r) => ({
    id: r.id,
    category: r.category,
    manufacturer: r.manufacturer,
    mpn: r.mpn,
    description: r.description,
    status: r.review_status,
    proposer: r.proposer,
    createdAt: new Date(r.created_at).toISOString(),
    version: r.version,
  }));
}
