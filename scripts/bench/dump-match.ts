/**
 * Profiling aid: writes the match pages of every demo design (three pages each) to DUMP_DIR, to compare
 * answers before and after a change to the match (not part of npm run bench).
 */
import { writeFileSync } from 'node:fs';
import { db } from '../../src/server/db.ts';
import { getDesign, listDesigns, matchInput, resolveMotor } from '../../src/server/services/designs.ts';
import { pageMatch } from '../../src/lib/match-page.ts';

const dir = process.env.DUMP_DIR ?? '.';
const { items } = await listDesigns({ page: 1, pageSize: 50 });
for (const row of items) {
  const { input } = await getDesign(row.id);
  const t0 = performance.now();
  const motor = await resolveMotor(input);
  const t1 = performance.now();
  const pages = [];
  // As the match routes do: each page ranked on its own, priced where a price can show.
  for (const p of [
    { offset: 0, limit: 25 },
    { offset: 100, limit: 25 },
    { offset: 5000, limit: 25 },
  ])
    pages.push(pageMatch(await matchInput(input, false, motor, db(), p), input, p));
  const t2 = performance.now();
  console.log(`${row.name.slice(0, 40).padEnd(40)} motor ${(t1 - t0).toFixed(0)} match ${(t2 - t1).toFixed(0)} ms`);
  writeFileSync(`${dir}/${row.id}.json`, JSON.stringify(pages));
}
await db().destroy();
