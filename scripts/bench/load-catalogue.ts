/**
 * Child process of npm run bench: fills the throwaway database named by the environment (DB_*) with
 * the invented large catalogue, multi-row inserts in batches, then refreshes the optimiser statistics.
 * Runs apart from the bench so the generator's memory never counts as the server's. Prints one JSON line.
 */
import knexFactory from 'knex';
import { knexConnectionConfig } from '../../src/server/knex-config.ts';
import { insertPartsBulk } from '../../src/server/repos/part-bulk.ts';
import type { NewPart } from '../../src/server/repos/parts.ts';
import { FULL_SIZE, generateCatalogue, type CatalogueSize } from './catalogue.ts';

const scale = Number(process.env.BENCH_SCALE ?? 1);
const size: CatalogueSize = {
  mosfets: Math.round(FULL_SIZE.mosfets * scale),
  diodes: Math.round(FULL_SIZE.diodes * scale),
  drivers: Math.round(FULL_SIZE.drivers * scale),
  motors: Math.round(FULL_SIZE.motors * scale),
};
const BATCH = 5_000;

const knex = knexFactory(knexConnectionConfig());
let statements = 0;
knex.on('query', () => statements++);
const t0 = performance.now();
let batch: NewPart[] = [];
let parts = 0;
const flush = async () => {
  await knex.transaction((trx) => insertPartsBulk(trx, batch, null));
  parts += batch.length;
  batch = [];
};
for (const part of generateCatalogue(size)) {
  batch.push(part);
  if (batch.length >= BATCH) await flush();
}
if (batch.length) await flush();
const insertS = (performance.now() - t0) / 1000;
for (const t of [
  'parts',
  'mosfet_params',
  'mosfet_rds_on_points',
  'driver_params',
  'diode_params',
  'motor_params',
  'part_sources',
  'part_price_breaks',
]) {
  await knex.raw(`analyze table ${t}`);
}
const sample: { category: string; mpn: string }[] = await knex('parts')
  .select('category', 'mpn')
  .whereRaw("mpn regexp '^[A-Z]{2}[NP][0-9]'")
  // The bench searches as a designer, who sees approved parts only (and their own proposals): sample those.
  .where({ review_status: 'approved' })
  .orderByRaw('rand(7)')
  .limit(40);
await knex.destroy();
console.log(JSON.stringify({ size, parts, insertS, statements, sampleMosfetMpns: sample.map((s) => s.mpn) }));
