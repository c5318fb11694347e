/**
 * Profiling aid for the parametric search (not part of npm run bench): against the database named by DB_*
 * (migrated; fill it with scripts/bench/load-catalogue.ts first), runs the search service with the query
 * npm run bench sends (three filters, as the demo designer sees the catalogue) PROFILE_RUNS times, and
 * prints p50 of the whole service call and of its statements (page + count, hydration).
 *   DB_*=… PROFILE_RUNS=15 node --import tsx scripts/bench/profile-search.ts
 */
import { migrateAndSeed } from '../stack/db-setup.ts';
import { db } from '../../src/server/db.ts';
import { partListQuerySchema } from '../../src/lib/schemas/parts.ts';
import { searchParts } from '../../src/server/services/parts-search.ts';
import { applySort, filteredPageAndCount, filteredParts, type ScopedPartQuery } from '../../src/server/repos/part-search.ts';
import { loadPartsByIds } from '../../src/server/repos/part-writes.ts';

const RUNS = Number(process.env.PROFILE_RUNS ?? 15);
await migrateAndSeed(process.env, { seed: false });
const designer = await db()('users').where('email', 'like', 'designer@%').first('id');
// The same query string as scripts/bench.ts sends for "parametric search, three filters".
const params = new URLSearchParams('category=mosfet&channel=n&vdsMinV=30&rdsOnAtVgsV=4.5&rdsOnMaxOhm=0.02&pageSize=25');
const parsed = partListQuerySchema.parse(Object.fromEntries(params));
const query: ScopedPartQuery = { ...parsed, approvedOrOwnedBy: Number(designer?.id ?? 0) };

async function timed(label: string, fn: () => Promise<unknown>): Promise<void> {
  await fn(); // warm-up
  const ms: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now();
    await fn();
    ms.push(performance.now() - t0);
  }
  ms.sort((a, b) => a - b);
  const at = (p: number) => ms[Math.min(ms.length - 1, Math.floor(p * ms.length))].toFixed(1);
  console.log(`${label.padEnd(40)} p50 ${at(0.5)} ms  p95 ${at(0.95)} ms  (${RUNS} runs)`);
}

const first = await searchParts(query);
console.log(
  `total ${first.total}, first ids ${first.items
    .slice(0, 5)
    .map((p) => p.id)
    .join(', ')}`,
);
await timed('searchParts (service)', () => searchParts(query));
await timed('page + count (one statement)', () => filteredPageAndCount(db(), query, 0, query.pageSize));
// The statement as it was before the governing intervals led the join (EXISTS per MOSFET of the channel
// and voltage), timed beside the current one under the same load.
const existsForm = () =>
  applySort(filteredParts(db(), query).select('parts.id', db().raw('count(*) over () as total')), query.sort).limit(query.pageSize);
await timed('page + count, EXISTS form (before)', () => existsForm());
// Rows the storage engine hands over (load-independent): handler reads of one run of each form, on one connection.
const reads = await db().transaction(async (trx) => {
  const status = async () => {
    const [rows] = await trx.raw("show session status like 'Handler_read%'");
    return (rows as { Variable_name: string; Value: string }[]).reduce((n, r) => n + Number(r.Value), 0);
  };
  const count = async (run: () => Promise<unknown>) => {
    const before = await status();
    await run();
    return (await status()) - before;
  };
  return {
    now: await count(() => filteredPageAndCount(trx, query, 0, query.pageSize)),
    before: await count(() =>
      applySort(filteredParts(trx, query).select('parts.id', trx.raw('count(*) over () as total')), query.sort).limit(query.pageSize),
    ),
  };
});
console.log(`handler reads per statement: now ${reads.now}, EXISTS form ${reads.before}`);
const { ids } = await filteredPageAndCount(db(), query, 0, query.pageSize);
await timed('hydrate 25 parts', () => loadPartsByIds(db(), ids));
await db().destroy();
