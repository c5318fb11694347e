/** The existing parts closest to a record under review: same category and package, nearest key ratings. */
import type { Db } from '../db.ts';
import type { PartCategory } from '../../lib/domain/parts.ts';

/** The ratings a reviewer compares first, per category: the table, its columns, and how each is read. */
export const KEY_RATINGS: Readonly<
  Record<PartCategory, { table: string; columns: readonly { column: string; label: string; unit: string }[] }>
> = {
  mosfet: {
    table: 'mosfet_params',
    columns: [
      { column: 'vds_max_v', label: 'VDS max', unit: 'V' },
      { column: 'id_continuous_a', label: 'ID', unit: 'A' },
    ],
  },
  diode: {
    table: 'diode_params',
    columns: [
      { column: 'vrrm_v', label: 'VRRM', unit: 'V' },
      { column: 'if_av_a', label: 'IF(AV)', unit: 'A' },
    ],
  },
  driver: {
    table: 'driver_params',
    columns: [
      { column: 'supply_max_v', label: 'supply max', unit: 'V' },
      { column: 'source_current_a', label: 'source', unit: 'A' },
    ],
  },
  motor: {
    table: 'motor_params',
    columns: [
      { column: 'rated_voltage_v', label: 'rated', unit: 'V' },
      { column: 'stall_current_a', label: 'stall', unit: 'A' },
    ],
  },
};

export interface NeighbourPart {
  id: number;
  manufacturer: string;
  mpn: string;
  reviewStatus: string;
  /** The key ratings, in KEY_RATINGS order. */
  ratings: (number | null)[];
}

/**
 * Up to `limit` other approved parts of the same category and package, nearest first by the relative
 * distance of their key ratings to the record's (each rating counted as |log ratio|, so 30 V vs 40 V
 * weighs the same as 3 A vs 4 A).
 */
export async function closestParts(db: Db, partId: number, category: PartCategory, pkg: string, limit = 3): Promise<NeighbourPart[]> {
  const { table, columns } = KEY_RATINGS[category];
  const own = await db(table)
    .where({ part_id: partId })
    .first(columns.map((c) => c.column));
  if (!own) return [];
  const distance = columns
    .filter((c) => typeof own[c.column] === 'number' && own[c.column] > 0)
    .map((c) => `COALESCE(ABS(LN(GREATEST(k.${c.column}, 1e-12) / ${Number(own[c.column])})), 10)`);
  const rows = await db('parts as p')
    .join(`${table} as k`, 'k.part_id', 'p.id')
    .select('p.id', 'p.manufacturer', 'p.mpn', 'p.review_status', ...columns.map((c) => `k.${c.column}`))
    .where({ 'p.category': category, 'p.package': pkg, 'p.review_status': 'approved' })
    .whereNot('p.id', partId)
    .orderByRaw(`${distance.length ? distance.join(' + ') : '0'}, p.mpn`)
    .limit(limit);
  return rows.map((r) => ({
    id: r.id,
    manufacturer: r.manufacturer,
    mpn: r.mpn,
    reviewStatus: r.review_status,
    ratings: columns.map((c) => (r[c.column] === null ? null : Number(r[c.column]))),
  }));
}
