/**
 * Many parts at once with multi-row writes: per chunk one INSERT per table (parts, the category
 * parameters, RDS(on) lines and their governing intervals, Zth lines, sources, price breaks) and two SELECTs that read the new ids
 * back through the unique keys — a handful of statements per chunk instead of several per part.
 * Call inside a transaction when the whole set must land or none of it.
 */
import type { Db } from '../db.ts';
import type { NewPart } from './parts.ts';
import { diodeToRow, driverToRow, governingToRows, mosfetToRow, motorToRow, rdsOnToRows, zthToRows } from './part-mapping.ts';

/** Rows per INSERT: well below max_allowed_packet for the widest table (parts, 500-character descriptions). */
export const BULK_CHUNK_ROWS = 500;

function chunks<T>(items: readonly T[], size: number): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < items.length; i += size) out.push(items.slice(i, i + size));
  return out;
}

async function insertMany(db: Db, table: string, rows: object[]): Promise<void> {
  for (const chunk of chunks(rows, BULK_CHUNK_ROWS)) await db(table).insert(chunk);
}

const partKey = (manufacturer: string, mpn: string) => `${manufacturer}\u0000${mpn}`;

/** Inserts the parts with their parameters and sources; returns the new ids in the order given. */
export async function insertPartsBulk(db: Db, parts: readonly NewPart[], createdBy: number | null): Promise<number[]> {
  const ids: number[] = [];
  for (const chunk of chunks(parts, BULK_CHUNK_ROWS)) {
    await db('parts').insert(
      chunk.map((p) => ({
        category: p.category,
        manufacturer: p.manufacturer,
        mpn: p.mpn,
        description: p.description,
        package: p.package,
        lifecycle: p.lifecycle,
        lifecycle_effective_date: p.lifecycleEffectiveDate,
        review_status: p.reviewStatus,
        created_by: createdBy,
      })),
    );
    const rows: { id: number; manufacturer: string; mpn: string }[] = await db('parts')
      .select('id', 'manufacturer', 'mpn')
      .whereIn(
        ['manufacturer', 'mpn'],
        chunk.map((p) => [p.manufacturer, p.mpn]),
      );
    const idOf = new Map(rows.map((r) => [partKey(r.manufacturer, r.mpn), r.id]));
    const chunkIds = chunk.map((p) => idOf.get(partKey(p.manufacturer, p.mpn))!);
    ids.push(...chunkIds);
    await insertChunkDetails(db, chunk, chunkIds);
  }
  return ids;
}

async function insertChunkDetails(db: Db, chunk: readonly NewPart[], ids: number[]): Promise<void> {
  const mosfets: object[] = [];
  const rdsOn: object[] = [];
  const governing: object[] = [];
  const zth: object[] = [];
  const drivers: object[] = [];
  const diodes: object[] = [];
  const motors: object[] = [];
  chunk.forEach((p, i) => {
    const id = ids[i];
    if (p.category === 'mosfet') {
      mosfets.push(mosfetToRow(id, p.params));
      rdsOn.push(...rdsOnToRows(id, p.params.rdsOn));
      governing.push(...governingToRows(id, p.params.rdsOn));
      zth.push(...zthToRows(id, p.params.zthPoints));
    } else if (p.category === 'driver') drivers.push(driverToRow(id, p.params));
    else if (p.category === 'diode') diodes.push(diodeToRow(id, p.params));
    else motors.push(motorToRow(id, p.params));
  });
  await insertMany(db, 'mosfet_params', mosfets);
  await insertMany(db, 'mosfet_rds_on_points', rdsOn);
  await insertMany(db, 'mosfet_rds_on_governing', governing);
  await insertMany(db, 'mosfet_zth_points', zth);
  await insertMany(db, 'driver_params', drivers);
  await insertMany(db, 'diode_params', diodes);
  await insertMany(db, 'motor_params', motors);

  const sources = chunk.flatMap((p, i) =>
    p.sources.map((s) => ({
      row: {
        part_id: ids[i],
        distributor: s.distributor,
        sku: s.sku,
        moq: s.moq,
        order_multiple: s.orderMultiple,
        lead_time_days: s.leadTimeDays,
        stock_qty: s.stockQty,
        currency: s.currency,
      },
      breaks: s.priceBreaks,
    })),
  );
  if (sources.length === 0) return;
  await insertMany(
    db,
    'part_sources',
    sources.map((s) => s.row),
  );
  const sourceRows: { id: number; part_id: number; distributor: string; sku: string }[] = await db('part_sources')
    .select('id', 'part_id', 'distributor', 'sku')
    .whereIn('part_id', ids);
  const sourceId = new Map(sourceRows.map((r) => [`${r.part_id}\u0000${r.distributor}\u0000${r.sku}`, r.id]));
  const breaks = sources.flatMap((s) => {
    const id = sourceId.get(`${s.row.part_id}\u0000${s.row.distributor}\u0000${s.row.sku}`)!;
    return s.breaks.map((b) => ({ source_id: id, qty: b.qty, unit_price: b.unitPrice }));
  });
  await insertMany(db, 'part_price_breaks', breaks);
}
