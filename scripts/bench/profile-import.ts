/**
 * Profiling aid for the CSV import (not part of npm run bench): starts a throwaway stack, fills it with the
 * invented catalogue (BENCH_SCALE, default 1), then runs the import service on a 5,000-row file of new
 * parts PROFILE_RUNS times (deleting them after each run) and prints wall time, CPU time of this process
 * and mariadbd's, and the time spent waiting on MariaDB (knex query to response). Run it under
 * `node --cpu-prof`:
 *   node --cpu-prof --cpu-prof-dir=/tmp/prof --import tsx scripts/bench/profile-import.ts
 * PROFILE_ROOT_SQL runs as MariaDB root before the first run, PROFILE_SWITCH_SQL before the middle one
 * (an A/B of a server setting in one process, e.g. SET GLOBAL innodb_log_file_size=268435456).
 */
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { startThrowawayStack } from '../stack/throwaway.ts';
import { db } from '../../src/server/db.ts';
import { commitImport } from '../../src/server/services/imports.ts';
import type { SessionUser } from '../../src/server/auth/types.ts';
import { DEMO_DOMAIN } from '../../db/seeds/demo.ts';
import { IMPORT_SERIAL_BASE, importFile } from './import-file.ts';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const RUNS = Number(process.env.PROFILE_RUNS ?? 3);
const stack = await startThrowawayStack(root);
try {
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/bench/load-catalogue.ts'], { stdio: 'inherit', env: stack.env });
  if (r.status !== 0) throw new Error('loading the catalogue failed');
  const rootSql = (sql: string) => {
    const q = spawnSync('mariadb', ['--no-defaults', `--socket=${stack.env.MARIADB_SOCKET}`, '-uroot', '-N', '-e', sql], {
      encoding: 'utf8',
    });
    console.log(`root SQL: ${q.status} ${q.stdout.trim()} ${q.stderr}`);
  };
  if (process.env.PROFILE_ROOT_SQL) {
    const q = spawnSync(
      'mariadb',
      ['--no-defaults', `--socket=${stack.env.MARIADB_SOCKET}`, '-uroot', '-e', process.env.PROFILE_ROOT_SQL],
      {
        encoding: 'utf8',
      },
    );
    console.log(`root SQL: ${q.status} ${q.stdout} ${q.stderr}`);
  }
  const k = db();
  const person = await k('users')
    .where({ email: `librarian@${DEMO_DOMAIN}` })
    .first('id', 'email', 'name');
  const user: SessionUser = { ...person, roles: ['librarian'] };
  let dbMs = 0;
  let statements = 0;
  const started = new Map<string, number>();
  k.on('query', (q: { __knexQueryUid: string }) => {
    statements++;
    started.set(q.__knexQueryUid, performance.now());
  });
  k.on('query-response', (_r: unknown, q: { __knexQueryUid: string }) => {
    dbMs += performance.now() - (started.get(q.__knexQueryUid) ?? performance.now());
    started.delete(q.__knexQueryUid);
  });
  // CPU time of mariadbd (user + system, ms) from /proc: on a shared machine it varies less than wall time.
  const dbPid = Number(readFileSync(stack.db.pidFile, 'utf8').trim());
  const dbCpuMs = () => {
    const f = readFileSync(`/proc/${dbPid}/stat`, 'utf8').split(') ')[1].split(' ');
    return ((Number(f[11]) + Number(f[12])) * 1000) / 100;
  };
  for (let run = 0; run < RUNS; run++) {
    if (process.env.PROFILE_SWITCH_SQL && run === Math.floor(RUNS / 2)) rootSql(process.env.PROFILE_SWITCH_SQL);
    const file = importFile(5_000, IMPORT_SERIAL_BASE + run * 5_000);
    dbMs = 0;
    statements = 0;
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    const d0 = dbCpuMs();
    const res = await commitImport(user, file.csv, `profile-import-${Date.now()}-${run}`);
    const wall = performance.now() - t0;
    const c = process.cpuUsage(c0);
    const dbCpu = dbCpuMs() - d0;
    console.log(
      `run ${run}: ${res.counts.created} created, wall ${wall.toFixed(0)} ms, CPU ${((c.user + c.system) / 1000).toFixed(0)} ms, ` +
        `waiting on MariaDB ${dbMs.toFixed(0)} ms over ${statements} statements, mariadbd CPU ${dbCpu.toFixed(0)} ms`,
    );
    const ids = (await k('parts').whereIn('mpn', file.mpns).pluck('id')) as number[];
    await k('parts').whereIn('id', ids).del();
  }
  await k.destroy();
} finally {
  await stack.cleanup();
}
process.exit(0);
