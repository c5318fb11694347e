/** Data access for catalogue parts. Functions take a Knex or a transaction so services can compose them. */
import type { Db } from '../db.ts';
import type { Part, PartCategory, PartSource } from '../../lib/domain/parts.ts';
import type {
  DbDiodeRow,
  DbDriverRow,
  DbMosfetRow,
  DbMotorRow,
  DbPartRow,
  DbPriceBreakRow,
  DbRdsOnRow,
  DbSourceRow,
  DbZthRow,
} from './part-rows.ts';
import {
  diodeFromRow,
  diodeToRow,
  driverFromRow,
  driverToRow,
  governingToRows,
  mosfetFromRows,
  mosfetToRow,
  motorFromRow,
  motorToRow,
  partHeadFromRow,
  rdsOnToRows,
  sourceFromRows,
  zthToRows,
} from './part-mapping.ts';

/** A part before it has an id: Omit distributed over the category union. */
export type NewPart = Part extends infer P ? (P extends Part ? Omit<P, 'id' | 'version'> : never) : never;

function groupBy<T, K>(items: T[], key: (t: T) => K): Map<K, T[]> {
  const map = new Map<K, T[]>();
  for (const item of items) {
    const k = key(item);
    const list = map.get(k);
    if (list) list.push(item);
    else map.set(k, [item]);
  }
  return map;
}

export async function insertSources(db: Db, partId: number, sources: PartSource[]): Promise<void> {
  for (const s of sources) {
    const [sourceId] = await db('part_sources').insert({
      part_id: partId,
      distributor: s.distributor,
      sku: s.sku,
      moq: s.moq,
      order_multiple: s.orderMultiple,
      lead_time_days: s.leadTimeDays,
      stock_qty: s.stockQty,
      currency: s.currency,
    });
    if (s.priceBreaks.length > 0) {
      await db('part_price_breaks').insert(s.priceBreaks.map((b) => ({ source_id: sourceId, qty: b.qty, unit_price: b.unitPrice })));
    }
  }
}

export async function insertParams(db: Db, partId: number, part: NewPart): Promise<void> {
  switch (part.category) {
    case 'mosfet':
      await db('mosfet_params').insert(mosfetToRow(partId, part.params));
      await db('mosfet_rds_on_points').insert(rdsOnToRows(partId, part.params.rdsOn));
      {
        const governing = governingToRows(partId, part.params.rdsOn);
        if (governing.length > 0) await db('mosfet_rds_on_governing').insert(governing);
      }
      // Zth points are optional (knex refuses an empty insert).
      if (part.params.zthPoints.length > 0) await db('mosfet_zth_points').insert(zthToRows(partId, part.params.zthPoints));
      return;
    case 'driver':
      await db('driver_params').insert(driverToRow(partId, part.params));
      return;
    case 'diode':
      await db('diode_params').insert(diodeToRow(partId, part.params));
      return;
    case 'motor':
      await db('motor_params').insert(motorToRow(partId, part.params));
      return;
  }
}

/** Inserts a part with its parameters and sources; call inside a transaction. Returns the new id. */
export async function insertPart(db: Db, part: NewPart, createdBy: number | null): Promise<number> {
  const [id] = await db('parts').insert({
    category: part.category,
    manufacturer: part.manufacturer,
    mpn: part.mpn,
    description: part.description,
    package: part.package,
    lifecycle: part.lifecycle,
    lifecycle_effective_date: part.lifecycleEffectiveDate,
    review_status: part.reviewStatus,
    created_by: createdBy,
  });
  await insertParams(db, id, part);
  await insertSources(db, id, part.sources);
  return id;
}

export async function findPartId(db: Db, manufacturer: string, mpn: string): Promise<number | null> {
  const row = await db('parts').select('id').where({ manufacturer, mpn }).first();
  return row ? (row.id as number) : null;
}

async function loadSources(db: Db, partIds: number[]): Promise<Map<number, PartSource[]>> {
  const sourceRows: DbSourceRow[] = await db('part_sources').whereIn('part_id', partIds).orderBy('id');
  const breakRows: DbPriceBreakRow[] = sourceRows.length
    ? await db('part_price_breaks').whereIn(
        'source_id',
        sourceRows.map((s) => s.id),
      )
    : [];
  const breaksBySource = groupBy(breakRows, (b) => b.source_id);
  const result = new Map<number, PartSource[]>();
  for (const s of sourceRows) {
    const list = result.get(s.part_id) ?? [];
    list.push(sourceFromRows(s, breaksBySource.get(s.id) ?? []));
    result.set(s.part_id, list);
  }
  return result;
}

/** Loads full domain parts for the given part rows (parameters and sources), in the rows' order. */
export async function hydrateParts(db: Db, rows: DbPartRow[]): Promise<Part[]> {
  if (rows.length === 0) return [];
  const ids = rows.map((r) => r.id);
  // Each parameter table only for the parts of its category: a page of one category sends three statements fewer.
  const idsOf = (category: PartCategory) => rows.filter((r) => r.category === category).map((r) => r.id);
  const [mosfetIds, driverIds, diodeIds, motorIds] = [idsOf('mosfet'), idsOf('driver'), idsOf('diode'), idsOf('motor')];
  const rowsOf = async <T>(table: string, partIds: number[]): Promise<T[]> => (partIds.length ? db(table).whereIn('part_id', partIds) : []);
  const [sources, mosfets, points, zthPoints, drivers, diodes, motors] = await Promise.all([
    loadSources(db, ids),
    rowsOf<DbMosfetRow>('mosfet_params', mosfetIds),
    rowsOf<DbRdsOnRow>('mosfet_rds_on_points', mosfetIds),
    rowsOf<DbZthRow>('mosfet_zth_points', mosfetIds),
    rowsOf<DbDriverRow>('driver_params', driverIds),
    rowsOf<DbDiodeRow>('diode_params', diodeIds),
    rowsOf<DbMotorRow>('motor_params', motorIds),
  ]);
  const byId = <T extends { part_id: number }>(list: T[]) => new Map(list.map((r) => [r.part_id, r]));
  const mosfetById = byId(mosfets);
  const pointsById = groupBy(points, (p) => p.part_id);
  const zthById = groupBy(zthPoints, (p) => p.part_id);
  const driverById = byId(drivers);
  const diodeById = byId(diodes);
  const motorById = byId(motors);
  const parts: Part[] = [];
  for (const row of rows) {
    const head = partHeadFromRow(row, sources.get(row.id) ?? []);
    if (row.category === 'mosfet' && mosfetById.has(row.id)) {
      parts.push({
        ...head,
        category: 'mosfet',
        params: mosfetFromRows(mosfetById.get(row.id)!, pointsById.get(row.id) ?? [], zthById.get(row.id) ?? []),
      });
    } else if (row.category === 'driver' && driverById.has(row.id)) {
      parts.push({ ...head, category: 'driver', params: driverFromRow(driverById.get(row.id)!) });
    } else if (row.category === 'diode' && diodeById.has(row.id)) {
      parts.push({ ...head, category: 'diode', params: diodeFromRow(diodeById.get(row.id)!) });
    } else if (row.category === 'motor' && motorById.has(row.id)) {
      parts.push({ ...head, category: 'motor', params: motorFromRow(motorById.get(row.id)!) });
    }
  }
  return parts;
}

export interface CatalogueQuery {
  category?: PartCategory;
  reviewStatuses?: string[];
}

/** Parts ordered by category, maker and number, fully hydrated. */
export async function listParts(db: Db, query: CatalogueQuery = {}): Promise<Part[]> {
  const q = db<DbPartRow>('parts')
    .select('*')
    .orderBy([{ column: 'category' }, { column: 'manufacturer' }, { column: 'mpn' }]);
  if (query.category) q.where('category', query.category);
  if (query.reviewStatuses) q.whereIn('review_status', query.reviewStatuses);
  return hydrateParts(db, await q);
}

export async function countPartsByCategory(db: Db): Promise<Record<PartCategory, number>> {
  const rows: { category: PartCategory; n: number }[] = await db('parts').select('category').count({ n: '*' }).groupBy('category');
  const counts: Record<PartCategory, number> = { motor: 0, mosfet: 0, driver: 0, diode: 0 };
  for (const r of rows) counts[r.category] = Number(r.n);
  return counts;
}

/** A part as a list of recent changes shows it (no parameters, no sources). */
export interface RecentPart {
  id: number;
  mpn: string;
  manufacturer: string;
  description: string;
  package: string;
  lifecycle: Part['lifecycle'];
  lifecycleEffectiveDate: string | null;
  reviewStatus: Part['reviewStatus'];
  updatedAt: string;
}

/** The most recently changed parts of a category, newest first (index parts_category_updated_idx). */
export async function recentlyChangedParts(db: Db, category: PartCategory, limit: number): Promise<RecentPart[]> {
  const rows: DbPartRow[] = await db<DbPartRow>('parts')
    .where('category', category)
    .orderBy([
      { column: 'updated_at', order: 'desc' },
      { column: 'id', order: 'desc' },
    ])
    .limit(limit);
  return rows.map((r) => ({
    id: r.id,
    mpn: r.mpn,
    manufacturer: r.manufacturer,
    description: r.description,
    package: r.package,
    lifecycle: r.lifecycle,
    lifecycleEffectiveDate: r.lifecycle_effective_date == null ? null : new Date(r.lifecycle_effective_date).toISOString().slice(0, 10),
    reviewStatus: r.review_status,
    updatedAt: new Date(r.updated_at).toISOString(),
  }));
}

/** Parts by id (any category), fully hydrated, keyed by id. */
/**
 * Motors a design form offers before any search: the first `limit` approved or pending by part number, plus
 * the ones asked for (a design's own motor, whatever its place in that order), those first.
 */
export async function motorsForOptions(db: Db, limit: number, includeIds: number[]): Promise<Part[]> {
  const rows: DbPartRow[] = await db('parts')
    .where({ category: 'motor' })
    .whereIn('review_status', ['approved', 'pending'])
    .orderBy([{ column: 'mpn' }, { column: 'id' }])
    .limit(limit);
  const extra = includeIds.filter((id) => !rows.some((r) => r.id === id));
  const more: DbPartRow[] = extra.length ? await db('parts').where({ category: 'motor' }).whereIn('id', extra) : [];
  return hydrateParts(db, [...more, ...rows]);
}

export async function partsByIds(db: Db, ids: number[]): Promise<Map<number, Part>> {
  if (ids.length === 0) return new Map();
  const rows: DbPartRow[] = await db('parts').whereIn('id', [...new Set(ids)]);
  const parts = await hydrateParts(db, rows);
  return new Map(parts.map((p) => [p.id as number, p]));
}

/** Who entered each existing part and its review status (the visibility rule reads these). */
export async function partAuthorsByIds(db: Db, ids: number[]): Promise<Map<number, { reviewStatus: string; createdBy: number | null }>> {
  if (ids.length === 0) return new Map();
  const rows: { id: number; review_status: string; created_by: number | null }[] = await db('parts')
    .select('id', 'review_status', 'created_by')
    .whereIn('id', [...new Set(ids)]);
  return new Map(rows.map((r) => [r.id, { reviewStatus: r.review_status, createdBy: r.created_by }]));
}

/** The category of each id that exists. */
export async function partCategoriesByIds(db: Db, ids: number[]): Promise<Map<number, string>> {
  if (ids.length === 0) return new Map();
  const rows: { id: number; category: string }[] = await db('parts')
    .select('id', 'category')
    .whereIn('id', [...new Set(ids)]);
  return new Map(rows.map((r) => [r.id, r.category]));
}
