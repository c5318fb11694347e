/** The buyers' preferred source and note per design, BOM line and part (see the migration's comments). */
import type { Db } from '../db.ts';
import type { PartRole } from '../../lib/domain/design.ts';

export type PreferenceLine = PartRole | 'motor';

interface DbPreferenceRow {
  id: number;
  design_id: number;
  line: PreferenceLine;
  part_id: number;
  preferred_distributor: string | null;
  preferred_sku: string | null;
  note: string | null;
  set_by: number | null;
  set_by_name?: string | null;
  mpn?: string;
  manufacturer?: string;
  updated_at: Date;
}

export interface StoredPreference {
  id: number;
  designId: number;
  line: PreferenceLine;
  partId: number;
  /** The preferred source by its distributor and SKU; null: the cheapest source. */
  source: { distributor: string; sku: string } | null;
  note: string | null;
  setByName: string | null;
  updatedAt: string;
  /** The part, for showing the preference by itself. */
  mpn: string;
  manufacturer: string;
}

function fromRow(row: DbPreferenceRow): StoredPreference {
  return {
    id: row.id,
    designId: row.design_id,
    line: row.line,
    partId: row.part_id,
    source:
      row.preferred_distributor !== null && row.preferred_sku !== null
        ? { distributor: row.preferred_distributor, sku: row.preferred_sku }
        : null,
    note: row.note,
    setByName: row.set_by_name ?? null,
    updatedAt: row.updated_at.toISOString(),
    mpn: row.mpn ?? '',
    manufacturer: row.manufacturer ?? '',
  };
}

/** Every preference of these designs, with the name of who set it. */
export async function listPreferences(db: Db, designIds: readonly number[]): Promise<StoredPreference[]> {
  if (designIds.length === 0) return [];
  const rows: DbPreferenceRow[] = await db('shortlist_preferences as p')
    .leftJoin('users as u', 'u.id', 'p.set_by')
    .join('parts as pt', 'pt.id', 'p.part_id')
    .select('p.*', 'u.name as set_by_name', 'pt.mpn', 'pt.manufacturer')
    .whereIn('p.design_id', designIds)
    // Only options the design's current revision still has (a preference on a dropped part is kept, not shown).
    .whereExists((q) =>
      q
        .select(db.raw('1'))
        .from('design_parts as dp')
        .whereRaw('dp.design_id = p.design_id and dp.role = p.line and dp.part_id = p.part_id'),
    )
    .orderBy(['p.design_id', 'p.line', 'p.part_id']);
  return rows.map(fromRow);
}

/** The preference of one design, line and part, locked for the rest of the transaction; null when none. */
export async function lockPreference(trx: Db, designId: number, line: PreferenceLine, partId: number): Promise<StoredPreference | null> {
  const row = await trx('shortlist_preferences').where({ design_id: designId, line, part_id: partId }).forUpdate().first();
  return row ? fromRow(row) : null;
}

/** Inserts or replaces the preference of one design, line and part; returns its id. */
export async function upsertPreference(
  trx: Db,
  p: {
    designId: number;
    line: PreferenceLine;
    partId: number;
    source: { distributor: string; sku: string } | null;
    note: string | null;
    setBy: number;
  },
): Promise<number> {
  const values = {
    preferred_distributor: p.source?.distributor ?? null,
    preferred_sku: p.source?.sku ?? null,
    note: p.note,
    set_by: p.setBy,
  };
  await trx('shortlist_preferences')
    .insert({ design_id: p.designId, line: p.line, part_id: p.partId, ...values })
    .onConflict(['design_id', 'line', 'part_id'])
    .merge({ ...values, updated_at: trx.fn.now(3) });
  const row = await trx('shortlist_preferences').select('id').where({ design_id: p.designId, line: p.line, part_id: p.partId }).first();
  return row.id as number;
}

export async function deletePreference(trx: Db, id: number): Promise<void> {
  await trx('shortlist_preferences').where({ id }).delete();
}

/** Whether the design's current revision uses the part on that line (chosen or alternate); the design row is locked. */
export async function designUsesPart(trx: Db, designId: number, line: PreferenceLine, partId: number): Promise<boolean> {
  const row = await trx('design_parts').where({ design_id: designId, role: line, part_id: partId }).first('position');
  return row !== undefined;
}

/** A source of the part by id: its distributor and SKU; null when the id is not one of the part's sources. */
export async function sourceOfPart(trx: Db, partId: number, sourceId: number): Promise<{ distributor: string; sku: string } | null> {
  const row = await trx('part_sources').where({ id: sourceId, part_id: partId }).first('distributor', 'sku');
  return row ? { distributor: row.distributor as string, sku: row.sku as string } : null;
}

/** Locks the design row for the transaction; false when there is no such design. */
export async function lockDesignRow(trx: Db, designId: number): Promise<boolean> {
  const row = await trx('designs').where({ id: designId }).forUpdate().first('id');
  return row !== undefined;
}
