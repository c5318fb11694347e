/**
 * Database faults under a running `npm start` (issue 11, items 6 and 8): MariaDB killed with SIGKILL in
 * the middle of a 5,000-row import, frozen with SIGSTOP, shut down and started again; and a backup and
 * restore round trip compared table by table (a digest of the stored columns; generated columns recomputed).
 * What must hold (the product's own promises, README "Running and faults"): an import commits whole or not at all, an acknowledged import survives a
 * crash, a database that does not answer gives 503 JSON with Retry-After within a few seconds, and the
 * app recovers without a restart.
 */
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startMariaDb, stopMariaDb } from '../../scripts/stack/mariadb.ts';
import {
  blockedOn,
  commitImport,
  DIODE_MAKER,
  diodeCsv,
  freeze,
  holdPartKey,
  root,
  signIn,
  startSupervisedStack,
  waitHealthy,
  type SupervisedStack,
} from './supervised-stack.ts';

let stack: SupervisedStack;
let librarian = '';
beforeAll(async () => {
  stack = await startSupervisedStack();
  librarian = await signIn(stack.url, 'librarian');
});
afterAll(async () => {
  await stack?.cleanup();
});

const partsLike = async (prefix: string): Promise<number> =>
  Number((await stack.knex()('parts').where('mpn', 'like', `${prefix}-%`).count({ n: '*' }).first())!.n);

/** The answer of an API route or page while the database is away: 503, Retry-After, and for the API our JSON shape. */
async function expectUnavailable(res: Response, api = true): Promise<void> {
  const body = await res.text();
  expect(res.status, body).toBe(503);
  expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0);
  if (api) expect(JSON.parse(body)).toMatchObject({ error: expect.stringMatching(/database/) });
}

async function timed<T>(f: () => Promise<T>): Promise<{ value: T; ms: number }> {
  const t0 = Date.now();
  const value = await f();
  return { value, ms: Date.now() - t0 };
}

describe('MariaDB killed with SIGKILL during a 5,000-row import', () => {
  it('restarts it; the cut import left nothing, every acknowledged import is whole, and the same key then imports once', async () => {
    // Three imports answered 201 before the crash: what the client was told is stored must stay stored.
    const acked: string[] = [];
    for (const n of [1, 2, 3]) {
      const res = await commitImport(stack.url, librarian, diodeCsv(`ACK${n}`, 12), `faults-ack-${n}`);
      expect(res.status, await res.clone().text()).toBe(201);
      acked.push(`ACK${n}`);
    }
    const big = diodeCsv('BIG', 5_000);
    const logFrom = stack.output().length;
    const pidBefore = stack.mariadbPid();
    // Row 2,500 of the file is taken by an uncommitted insert of the test: the import stops there,
    // half its rows written in its transaction, until MariaDB is killed under it.
    const hold = await holdPartKey(stack, { category: 'diode', manufacturer: DIODE_MAKER, mpn: 'BIG-02500' });
    try {
      const { answer, rowsModified } = await blockedOn(hold, () => commitImport(stack.url, librarian, big, 'faults-big-1'));
      // The 2,499 parts before the held row at least (their parameters and audit rows come on top).
      expect(rowsModified).toBeGreaterThanOrEqual(2_499);
      process.kill(pidBefore, 'SIGKILL');
      await expectUnavailable(await answer);
    } finally {
      hold.close();
    }

    await stack.waitForLog(/MariaDB restarted \(pid (\d+)\)/, 60_000, logFrom);
    expect(stack.output().slice(logFrom)).toMatch(/MariaDB \(pid \d+\) crashed \(killed by SIGKILL\)/);
    expect(stack.mariadbPid()).not.toBe(pidBefore);
    await waitHealthy(stack.url, 30_000);

    expect(await partsLike('BIG')).toBe(0);
    expect(await stack.knex()('import_requests').where({ idempotency_key: 'faults-big-1' }).first()).toBeUndefined();
    for (const prefix of acked) expect(await partsLike(prefix)).toBe(12);
    const keys = await stack.knex()('import_requests').whereIn('idempotency_key', ['faults-ack-1', 'faults-ack-2', 'faults-ack-3']);
    expect(keys.map((k) => k.rows_imported)).toEqual([12, 12, 12]);

    // The client that got a 503 tries again with the same key: now the whole file, once.
    const again = await commitImport(stack.url, librarian, big, 'faults-big-1');
    expect(again.status, (await again.clone().text()).slice(0, 500)).toBe(201);
    expect(await partsLike('BIG')).toBe(5_000);
  });
});

describe('MariaDB frozen with SIGSTOP', () => {
  it('answers 503 JSON with Retry-After within a few seconds on every path, and serves again after SIGCONT', async () => {
    const designer = await signIn(stack.url, 'designer');
    const pid = stack.mariadbPid();
    await freeze(pid);
    try {
      const health = await timed(() => fetch(`${stack.url}/api/health`));
      await expectUnavailable(health.value, false);
      const signin = await timed(() =>
        fetch(`${stack.url}/api/auth/signin`, {
          method: 'POST',
          headers: { 'Content-Type': 'application/json' },
          body: JSON.stringify({ email: 'buyer@kestrel-fluidics.example', password: 'stallpoint-demo' }),
        }),
      );
      await expectUnavailable(signin.value);
      const parts = await timed(() => fetch(`${stack.url}/api/parts`, { headers: { Cookie: designer } }));
      await expectUnavailable(parts.value);
      // DB_QUERY_TIMEOUT_MS is 5 s by default: each answer within that and a margin, not a hang.
      for (const t of [health, signin, parts]) expect(t.ms).toBeLessThan(8_000);
    } finally {
      process.kill(pid, 'SIGCONT');
    }
    const back = await fetch(`${stack.url}/api/parts`, { headers: { Cookie: designer } });
    expect(back.status).toBe(200);
    expect(stack.mariadbPid()).toBe(pid);
  });
});

describe('MariaDB shut down and started again under the running app', () => {
  it('answers 503 meanwhile (sign-in included), then recovers without an app restart', async () => {
    const designer = await signIn(stack.url, 'designer');
    const appPid = stack.appPid();
    const logFrom = stack.output().length;
    await stopMariaDb(stack.db);
    await stack.waitForLog(/MariaDB \(pid \d+\) ended \(exit code 0\) and was stopped on purpose: not restarting it/, 10_000, logFrom);

    const health = await fetch(`${stack.url}/api/health`);
    expect(await health.clone().json()).toEqual({ db: 'unavailable' });
    await expectUnavailable(health, false);
    await expectUnavailable(
      await fetch(`${stack.url}/api/auth/signin`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json' },
        body: JSON.stringify({ email: 'buyer@kestrel-fluidics.example', password: 'stallpoint-demo' }),
      }),
    );
    await expectUnavailable(await fetch(`${stack.url}/api/parts`, { headers: { Cookie: designer } }));
    await expectUnavailable(await fetch(`${stack.url}/parts`, { headers: { Cookie: designer } }), false);

    await startMariaDb(stack.db);
    await waitHealthy(stack.url, 30_000);
    expect((await fetch(`${stack.url}/api/parts`, { headers: { Cookie: designer } })).status).toBe(200);
    expect(await signIn(stack.url, 'buyer')).toMatch(/^stallpoint_session=/);
    expect(stack.appPid()).toBe(appPid);
    expect(stack.output().slice(logFrom)).not.toMatch(/app server .*crashed/);
  });
});

describe('npm run db:backup and npm run db:restore', () => {
  /**
   * A digest per table over its stored columns only, rows in a fixed order. Generated columns (the parts
   * table's normalised part numbers) are left out here: the restore writes the stored columns and the
   * database recomputes the generated ones, which `generatedMismatches` checks separately.
   */
  async function checksums(): Promise<Record<string, string>> {
    const k = stack.knex();
    const [tables] = (await k.raw('SHOW FULL TABLES WHERE Table_type = ?', ['BASE TABLE'])) as [Record<string, string>[]];
    const names = tables.map((t) => Object.values(t)[0]).sort();
    const out: Record<string, string> = {};
    for (const name of names) {
      const [cols] = (await k.raw(
        "SELECT COLUMN_NAME AS c FROM information_schema.COLUMNS WHERE TABLE_SCHEMA = DATABASE() AND TABLE_NAME = ? AND GENERATION_EXPRESSION IS NULL AND EXTRA NOT LIKE '%GENERATED%' ORDER BY ORDINAL_POSITION",
        [name],
      )) as [{ c: string }[]];
      const list = cols.map((c) => `\`${c.c}\``).join(', ');
      const [rows] = (await k.raw(`SELECT ${list} FROM \`${name}\` ORDER BY ${cols.map((_, i) => i + 1).join(', ')}`)) as [unknown[]];
      out[name] = createHash('sha256').update(JSON.stringify(rows)).digest('hex');
    }
    return out;
  }
  /** Rows whose generated column does not hold what its expression gives from the stored columns. */
  async function generatedMismatches(): Promise<Record<string, number>> {
    const k = stack.knex();
    const [gens] = (await k.raw(
      'SELECT TABLE_NAME AS t, COLUMN_NAME AS c, GENERATION_EXPRESSION AS e FROM information_schema.COLUMNS WHERE TABLE_SCHEMA = DATABASE() AND GENERATION_EXPRESSION IS NOT NULL',
    )) as [{ t: string; c: string; e: string }[]];
    const out: Record<string, number> = {};
    for (const g of gens) {
      const [[row]] = (await k.raw(`SELECT COUNT(*) AS n FROM \`${g.t}\` WHERE NOT (\`${g.c}\` <=> (${g.e}))`)) as [{ n: number }[]];
      out[`${g.t}.${g.c}`] = Number(row.n);
    }
    return out;
  }
  const npmRun = (script: string, file: string) =>
    spawnSync('npm', ['run', '--silent', script, '--', file], { cwd: root, env: stack.env, encoding: 'utf8' });

  it('round-trips the database: every stored column equal to backup time, generated columns recomputed', async () => {
    const file = path.join(stack.env.DATA_DIR!, 'backups', 'round-trip.sql');
    const before = await checksums();
    expect(Object.keys(before)).toEqual(expect.arrayContaining(['parts', 'users', 'import_requests', 'audit_events']));
    const backup = npmRun('db:backup', file);
    expect(backup.status, backup.stderr + backup.stdout).toBe(0);

    // Change the data after the backup, so that the restore has something to undo (and the check can fail).
    // (The first part by id: the import tests above may be skipped or filtered out, so no imported row is assumed.)
    const first = await stack.knex()('parts').min('id as id').first();
    expect(first?.id, 'the stack has parts to back up').toBeTruthy();
    await stack.knex()('parts').where({ id: first!.id }).update({ description: 'changed after the backup' });
    const hasImports = Number((await stack.knex()('import_requests').count('* as n').first())!.n) > 0;
    await stack
      .knex()('import_requests')
      .update({ rows_imported: stack.knex().raw('rows_imported + 1') });
    const changed = await checksums();
    expect(changed.parts).not.toBe(before.parts);
    if (hasImports) expect(changed.import_requests).not.toBe(before.import_requests);

    const restore = npmRun('db:restore', file);
    expect(restore.status, restore.stderr + restore.stdout).toBe(0);
    expect(await checksums()).toEqual(before);
    const gens = await generatedMismatches();
    expect(Object.keys(gens)).toEqual(expect.arrayContaining(['parts.mpn_norm', 'parts.mpn_rev']));
    expect(
      Object.values(gens).every((n) => n === 0),
      JSON.stringify(gens),
    ).toBe(true);
  });
});
