/** Reads and writes of one part for the edit, review and lifecycle services (inside their transactions). */
import type { Db } from '../db.ts';
import type { Lifecycle, Part, PartSource, ReviewStatus } from '../../lib/domain/parts.ts';
import type { DbPartRow } from './part-rows.ts';
import { hydrateParts, insertParams, insertSources, type NewPart } from './parts.ts';

const PARAM_TABLES = [
  'mosfet_rds_on_points',
  'mosfet_rds_on_governing',
  'mosfet_zth_points',
  'mosfet_params',
  'driver_params',
  'diode_params',
  'motor_params',
] as const;

/** The part row, locked against concurrent writers until the transaction ends. */
export async function lockPartRow(trx: Db, id: number): Promise<DbPartRow | null> {
  const row = await trx<DbPartRow>('parts').where({ id }).forUpdate().first();
  return row ?? null;
}

export async function findPartRow(db: Db, id: number): Promise<DbPartRow | null> {
  return (await db<DbPartRow>('parts').where({ id }).first()) ?? null;
}

/** Full domain parts for the ids, in the ids' order. */
export async function loadPartsByIds(db: Db, ids: number[]): Promise<Part[]> {
  if (ids.length === 0) return [];
  const rows: DbPartRow[] = await db('parts').whereIn('id', ids);
  const order = new Map(ids.map((id, i) => [id, i]));
  rows.sort((a, b) => order.get(a.id)! - order.get(b.id)!);
  return hydrateParts(db, rows);
}

export async function loadPart(db: Db, id: number): Promise<Part | null> {
  const [part] = await loadPartsByIds(db, [id]);
  return part ?? null;
}

export interface PartHeadUpdate {
  manufacturer: string;
  mpn: string;
  description: string;
  package: string;
  reviewStatus: ReviewStatus;
}

async function bump(db: Db, id: number, fields: Record<string, unknown>): Promise<void> {
  await db('parts')
    .where({ id })
    .update({ ...fields, version: db.raw('version + 1'), updated_at: db.fn.now(3) });
}

export async function updatePartHead(db: Db, id: number, head: PartHeadUpdate): Promise<void> {
  await bump(db, id, {
    manufacturer: head.manufacturer,
    mpn: head.mpn,
    description: head.description,
    package: head.package,
    review_status: head.reviewStatus,
  });
}

/** Replaces the category parameters (and RDS(on) lines and Zth points) of a part. */
export async function replaceParams(db: Db, id: number, part: NewPart): Promise<void> {
  for (const table of PARAM_TABLES) await db(table).where({ part_id: id }).delete();
  await insertParams(db, id, part);
}

/** Replaces every source of a part (price breaks go with their source by cascade). */
export async function replaceSources(db: Db, id: number, sources: PartSource[]): Promise<void> {
  await db('part_sources').where({ part_id: id }).delete();
  await insertSources(db, id, sources);
}

export async function touchPart(db: Db, id: number): Promise<void> {
  await bump(db, id, {});
}

export async function setReview(db: Db, id: number, status: ReviewStatus, note: string | null): Promise<void> {
  await bump(db, id, { review_status: status, review_note: note });
}

export async function setLifecycle(db: Db, id: number, lifecycle: Lifecycle, effectiveDate: string, note: string): Promise<void> {
  await bump(db, id, { lifecycle, lifecycle_effective_date: effectiveDate, lifecycle_note: note });
}

export async function deletePartRow(db: Db, id: number): Promise<void> {
  await db('parts').where({ id }).delete();
}

export async function findPartIdByMakerMpn(db: Db, manufacturer: string, mpn: string): Promise<number | null> {
  const row = await db('parts').select('id').where({ manufacturer, mpn }).first();
  return row ? (row.id as number) : null;
}

/** Distinct packages in use, per category (for the search page's package picker). */
export async function packagesByCategory(db: Db): Promise<Record<string, string[]>> {
  const rows: { category: string; package: string }[] = await db('parts')
    .distinct('category', 'package')
    .where('package', '<>', '')
    .orderBy('package');
  const out: Record<string, string[]> = {};
  for (const r of rows) (out[r.category] ??= []).push(r.package);
  return out;
}

/** Parts with any of the part numbers (every maker), queried in batches of 500. */
export async function findPartsByMpns(db: Db, mpns: string[]): Promise<{ id: number; manufacturer: string; mpn: string }[]> {
  const out: { id: number; manufacturer: string; mpn: string }[] = [];
  for (let i = 0; i < mpns.length; i += 500) {
    out.push(
      ...(await db('parts')
        .select('id', 'manufacturer', 'mpn')
        .whereIn('mpn', mpns.slice(i, i + 500))),
    );
  }
  return out;
}
