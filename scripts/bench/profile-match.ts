/**
 * Profiling aid for the match (not part of npm run bench): against the database named by DB_* (filled
 * once with the invented catalogue when it holds no generated parts), runs the match service for every
 * demo design PROFILE_RUNS times and prints the time of each phase. Run it under `node --cpu-prof`.
 *   DB_*=… BENCH_SCALE=0.3 node --cpu-prof --import tsx scripts/bench/profile-match.ts
 */
import { spawnSync } from 'node:child_process';
import { migrateAndSeed } from '../stack/db-setup.ts';
import { db } from '../../src/server/db.ts';
import { getDesign, listDesigns, matchInput, resolveMotor } from '../../src/server/services/designs.ts';
import { pageMatch } from '../../src/lib/match-page.ts';
import { demoDesigns } from '../../db/seeds/designs.ts';

const RUNS = Number(process.env.PROFILE_RUNS ?? 3);
await migrateAndSeed(process.env, { seed: true });
const [{ n }] = await db()('parts').count({ n: '*' });
if (Number(n) < 1000) {
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/bench/load-catalogue.ts'], { stdio: 'inherit', env: process.env });
  if (r.status !== 0) throw new Error('loading the catalogue failed');
}
const { items } = await listDesigns({ page: 1, pageSize: 50 });
for (const d of demoDesigns) {
  const row = items.find((x) => x.name === d.name);
  if (!row) continue;
  const { input } = await getDesign(row.id);
  const times: number[] = [];
  const cpu: number[] = [];
  let sizes = '';
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    const motor = await resolveMotor(input);
    // As the match routes do: the first page at the default size, priced where a price can show.
    const match = await matchInput(input, false, motor, db(), { offset: 0, limit: 25 });
    const page = pageMatch(match, input, { offset: 0, limit: 25 });
    times.push(performance.now() - t0);
    const c1 = process.cpuUsage(c0);
    cpu.push((c1.user + c1.system) / 1000);
    sizes = `switch ${match.switch.length}, withDriver ${match.switchWithDriver.length}, driver ${match.driver.length}, diode ${match.diode.length}; ${JSON.stringify(page).length} B`;
  }
  // CPU time of this process (user + system) besides the wall time: on a shared machine it varies less.
  const p50 = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)].toFixed(0);
  console.log(
    `${d.name.padEnd(58)} ${times.map((t) => t.toFixed(0)).join(' / ')} ms, p50 ${p50(times)} ms, CPU p50 ${p50(cpu)} ms  (${sizes})`,
  );
}
await db().destroy();
