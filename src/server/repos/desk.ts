/** The home page's per-role lists: each one limited and on indexed columns, whatever the catalogue's size. */
import type { Db } from '../db.ts';

export interface DeskPart {
  id: number;
  mpn: string;
  manufacturer: string;
  category: string;
}

const toPart = (r: { id: number; mpn: string; manufacturer: string; category: string }): DeskPart => ({
  id: r.id,
  mpn: r.mpn,
  manufacturer: r.manufacturer,
  category: r.category,
});

/** Parts waiting for review: the oldest few and how many in all. */
export async function reviewQueueHead(db: Db, limit: number): Promise<{ items: DeskPart[]; total: number }> {
  const base = db('parts').where('review_status', 'pending');
  const [rows, [{ n }]] = await Promise.all([
    base
      .clone()
      .select('id', 'mpn', 'manufacturer', 'category')
      .orderBy([{ column: 'created_at' }, { column: 'id' }])
      .limit(limit),
    base.clone().count({ n: '*' }),
  ]);
  return { items: rows.map(toPart), total: Number(n) };
}

/** Approved parts without a datasheet on file: the newest few and how many in all. */
export async function partsMissingDatasheets(db: Db, limit: number): Promise<{ items: DeskPart[]; total: number }> {
  const base = db('parts as p')
    .where('p.review_status', 'approved')
    .whereNotExists(db('datasheets as d').whereRaw('d.part_id = p.id').select(db.raw('1')));
  const [rows, [{ n }]] = await Promise.all([
    base.clone().select('p.id', 'p.mpn', 'p.manufacturer', 'p.category').orderBy('p.id', 'desc').limit(limit),
    base.clone().count({ n: '*' }),
  ]);
  return { items: rows.map(toPart), total: Number(n) };
}

export interface DeskImport {
  id: number;
  rowsImported: number;
  by: string | null;
  at: string;
}

/** The last few committed CSV imports. */
export async function recentImports(db: Db, limit: number): Promise<DeskImport[]> {
  const rows: { id: number; rows_imported: number; name: string | null; created_at: Date }[] = await db('import_requests as i')
    .leftJoin('users as u', 'u.id', 'i.user_id')
    .select('i.id', 'i.rows_imported', 'u.name', 'i.created_at')
    .orderBy('i.id', 'desc')
    .limit(limit);
  return rows.map((r) => ({ id: r.id, rowsImported: r.rows_imported, by: r.name, at: new Date(r.created_at).toISOString() }));
}

/** Active people, and invited people who have not set a password yet. */
export async function peopleCounts(db: Db): Promise<{ active: number; invited: number }> {
  const [[{ active }], [{ invited }]] = await Promise.all([
    db('users').where('active', true).whereNotNull('password_hash').count({ active: '*' }),
    db('users').where('active', true).whereNull('password_hash').count({ invited: '*' }),
  ]);
  return { active: Number(active), invited: Number(invited) };
}

/** The chosen part of each line (design_parts position 0) of some designs, with its stock over all sources. */
export async function chosenPartStock(
  db: Db,
  designIds: number[],
): Promise<{ designId: number; role: string; mpn: string; inStock: number }[]> {
  if (designIds.length === 0) return [];
  const rows: { design_id: number; role: string; mpn: string; stock: number | string }[] = await db('design_parts as dp')
    .join('parts as p', 'p.id', 'dp.part_id')
    .leftJoin('part_sources as s', 's.part_id', 'p.id')
    .whereIn('dp.design_id', designIds)
    .where('dp.position', 0)
    .groupBy('dp.design_id', 'dp.role', 'p.id', 'p.mpn')
    .select('dp.design_id', 'dp.role', 'p.mpn', db.raw('COALESCE(SUM(s.stock_qty), 0) AS stock'))
    .orderByRaw("dp.design_id, FIELD(dp.role, 'motor', 'switch', 'driver', 'diode')");
  return rows.map((r) => ({ designId: r.design_id, role: r.role, mpn: r.mpn, inStock: Number(r.stock) }));
}
