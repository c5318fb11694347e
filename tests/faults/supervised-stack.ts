/**
 * A real `npm start` (node scripts/start.mjs) of its own for the fault tests: a private MariaDB under a
 * temp folder, free ports, its own database password (so no .env is read or written), the app server
 * in the supervised child process. The tests kill, freeze and stop its parts and read its log.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import knexFactory, { type Knex } from 'knex';
import mysql from 'mysql2/promise';
import { CONFIG_KEYS } from '../../src/server/config.ts';
import { knexConfig } from '../../knexfile.ts';
import { freePort } from '../../scripts/stack/throwaway.ts';
import { generatedSecret } from '../../scripts/stack/env-file.ts';
import { adminPing, describeInstance, rootSql, stopMariaDb, type MariaDbInstance } from '../../scripts/stack/mariadb.ts';
import { DEMO_DOMAIN, DEMO_PASSWORD } from '../../db/seeds/demo.ts';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

export interface SupervisedStack {
  url: string;
  env: NodeJS.ProcessEnv;
  db: MariaDbInstance;
  proc: ChildProcess;
  /** Resolves with the exit of `npm start`. */
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
  /** Everything `npm start` printed so far. */
  output(): string;
  /** Waits until the log (from `from` on) matches. */
  waitForLog(re: RegExp, timeoutMs: number, from?: number): Promise<RegExpMatchArray>;
  mariadbPid(): number;
  /** The pid of the app server child now serving (the latest the log names). */
  appPid(): number;
  knex(): Knex;
  cleanup(): Promise<void>;
}

/** The environment without anything the surrounding `npm test` stack set for itself. */
function cleanEnv(): NodeJS.ProcessEnv {
  const env = { ...process.env };
  for (const k of CONFIG_KEYS) delete env[k.key];
  for (const k of ['STALLPOINT_URL', 'MARIADB_DATADIR', 'MARIADB_SOCKET', 'MARIADB_PORT', 'DB_SCRATCH_NAME', 'DB_SNAPSHOT_NAME'])
    delete env[k];
  return env;
}

export async function startSupervisedStack(extra: NodeJS.ProcessEnv = {}): Promise<SupervisedStack> {
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'stallpoint-faults-'));
  const env: NodeJS.ProcessEnv = {
    ...cleanEnv(),
    NODE_ENV: 'test',
    HOST: '127.0.0.1',
    PORT: String(await freePort()),
    DB_PORT: String(await freePort()),
    DB_NAME: 'stallpoint_faults',
    DB_USER: 'stallpoint_faults',
    DB_PASSWORD: generatedSecret(),
    DATA_DIR: path.join(tmp, 'data'),
    MAIL_SINK: 'local',
    ...extra,
  };
  const db = describeInstance(path.join(env.DATA_DIR!, 'mariadb'), Number(env.DB_PORT));
  const proc = spawn(process.execPath, ['scripts/start.mjs'], { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'] });
  let out = '';
  const listeners = new Set<() => void>();
  const onData = (c: Buffer): void => {
    out += c.toString();
    for (const l of listeners) l();
  };
  proc.stdout!.on('data', onData);
  proc.stderr!.on('data', onData);
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    proc.once('exit', (code, signal) => resolve({ code, signal })),
  );
  let ended = false;
  void exited.then(() => {
    ended = true;
    for (const l of listeners) l();
  });

  const waitForLog = (re: RegExp, timeoutMs: number, from = 0): Promise<RegExpMatchArray> =>
    new Promise((resolve, reject) => {
      const check = (): void => {
        const m = out.slice(from).match(re);
        if (m) return done(() => resolve(m));
        if (ended) return done(() => reject(new Error(`npm start ended before the log matched ${re}:\n${out.slice(-3000)}`)));
      };
      const timer = setTimeout(
        () => done(() => reject(new Error(`the log did not match ${re} in ${timeoutMs} ms:\n${out.slice(-3000)}`))),
        timeoutMs,
      );
      const done = (f: () => void): void => {
        clearTimeout(timer);
        listeners.delete(check);
        f();
      };
      listeners.add(check);
      check();
    });

  let knex: Knex | null = null;
  const cleanup = async (): Promise<void> => {
    await knex?.destroy();
    knex = null;
    if (!ended) {
      proc.kill('SIGTERM');
      const timer = setTimeout(() => proc.kill('SIGKILL'), 60_000);
      await exited;
      clearTimeout(timer);
    }
    // A MariaDB a test started itself, or one left behind by a killed run.
    if (adminPing(db)) await stopMariaDb(db);
    rmSync(tmp, { recursive: true, force: true });
  };

  try {
    const m = await waitForLog(/Stallpoint is running at (http:\/\/\S+)/, 300_000);
    return {
      url: m[1],
      env,
      db,
      proc,
      exited,
      output: () => out,
      waitForLog,
      mariadbPid: () => Number(readFileSync(db.pidFile, 'utf8').trim()),
      appPid: () => {
        const pids = [...out.matchAll(/app server (?:pid |restarted \(pid )(\d+)/g)].map((x) => Number(x[1]));
        return pids[pids.length - 1];
      },
      knex: () => (knex ??= knexFactory(knexConfig(env))),
      cleanup,
    };
  } catch (err) {
    await cleanup();
    throw err;
  }
}

/** Signs a demo person in through the API; the Cookie header value of the new session. */
export async function signIn(url: string, role: string): Promise<string> {
  const res = await fetch(`${url}/api/auth/signin`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: `${role}@${DEMO_DOMAIN}`, password: DEMO_PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in as ${role} answered ${res.status}: ${await res.text()}`);
  const cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .find((c) => c.startsWith('stallpoint_session='));
  if (!cookie) throw new Error('no session cookie');
  return cookie;
}

/** Polls until GET /api/health answers 200 (the database back and the app serving it). */
export async function waitHealthy(url: string, timeoutMs: number): Promise<void> {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const status = await fetch(`${url}/api/health`).then(
      (r) => r.status,
      () => 0,
    );
    if (status === 200) return;
    if (Date.now() > end) throw new Error(`/api/health did not answer 200 within ${timeoutMs} ms (last: ${status})`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

/** The invented maker of every row diodeCsv writes. */
export const DIODE_MAKER = 'Faultline Test Parts';

/** A CSV of `n` invented Schottky diode rows (maker and part numbers `${prefix}-00001`… invented). */
export function diodeCsv(prefix: string, n: number): string {
  const header = 'category,manufacturer,mpn,package,lifecycle,reviewStatus,kind,vrrmV,ifAvA,ifsmA,vfV,vfAtIfA';
  const mpn = (i: number): string => `${prefix}-${String(i + 1).padStart(5, '0')}`;
  const rows = Array.from({ length: n }, (_, i) => `diode,${DIODE_MAKER},${mpn(i)},SOD-123,active,pending,schottky,40,1,25,0.5,1`);
  return [header, ...rows].join('\n') + '\n';
}

/** POST /api/imports?mode=commit with an Idempotency-Key. */
export function commitImport(url: string, cookie: string, csv: string, key: string): Promise<Response> {
  return fetch(`${url}/api/imports?mode=commit`, {
    method: 'POST',
    headers: { Cookie: cookie, 'Content-Type': 'text/csv', 'Idempotency-Key': key },
    body: csv,
  });
}

/**
 * A connection of the test's own, as a user made for it by root (not the app's user, whose rights stay as
 * `npm start` sets them): PROCESS to read information_schema.INNODB_TRX and INNODB_LOCK_WAITS, and
 * INSERT on the parts table to hold a key.
 */
const probePasswords = new WeakMap<SupervisedStack, string>();
async function probeConnection(stack: SupervisedStack): Promise<mysql.Connection> {
  const password = probePasswords.get(stack) ?? generatedSecret();
  probePasswords.set(stack, password);
  rootSql(
    stack.db,
    [
      `CREATE USER IF NOT EXISTS 'faults_probe'@'127.0.0.1' IDENTIFIED BY '${password}';`,
      `ALTER USER 'faults_probe'@'127.0.0.1' IDENTIFIED BY '${password}';`,
      "GRANT PROCESS ON *.* TO 'faults_probe'@'127.0.0.1';",
      `GRANT SELECT, INSERT ON \`${stack.env.DB_NAME}\`.* TO 'faults_probe'@'127.0.0.1';`,
    ].join(' '),
  );
  const c = await mysql.createConnection({
    host: '127.0.0.1',
    port: Number(stack.env.DB_PORT),
    user: 'faults_probe',
    password,
    database: stack.env.DB_NAME,
  });
  // A MariaDB killed under it ends the connection with an error event: expected here, not a test failure.
  c.on('error', () => {});
  return c;
}

/** A part key (maker and part number) held by an open transaction of the test; see holdPartKey. */
export interface PartKeyHold {
  /**
   * Resolves once a transaction of the app waits (LOCK WAIT) on the held key, with the rows it has
   * changed so far; rejects when `answered()` turns true first (the request ended without waiting) or
   * after `timeoutMs`.
   */
  waitUntilBlocked(timeoutMs: number, answered: () => boolean): Promise<{ rowsModified: number }>;
  /** Rolls the holding transaction back: the waiting statement goes on as if the key had never been taken. */
  release(): Promise<void>;
  /** Ends both connections (after a release, or after MariaDB went away and took the transaction with it). */
  close(): void;
}

/**
 * Holds the unique key (manufacturer, mpn) of parts (`parts_manufacturer_mpn_unique`) with an
 * uncommitted INSERT on a connection of the test's own. An import whose file has that row reads around
 * the uncommitted row (consistent read: no duplicate reported) and then waits for the lock when it
 * inserts it, whether one row per statement or many rows in one statement: the import is then provably
 * mid-way, with every earlier row written in its transaction, and stays there until `release()` (or
 * until the lock wait or query timeout ends it; innodb_lock_wait_timeout is MariaDB's default 50 s).
 */
export async function holdPartKey(
  stack: SupervisedStack,
  part: { category: string; manufacturer: string; mpn: string },
): Promise<PartKeyHold> {
  const holder = await probeConnection(stack);
  const watcher = await probeConnection(stack);
  await holder.beginTransaction();
  await holder.query('INSERT INTO parts (category, manufacturer, mpn) VALUES (?, ?, ?)', [part.category, part.manufacturer, part.mpn]);
  const holderThread = holder.threadId;
  return {
    async waitUntilBlocked(timeoutMs, answered) {
      const end = Date.now() + timeoutMs;
      for (;;) {
        const [rows] = (await watcher.query(
          `SELECT r.trx_rows_modified AS rowsModified
             FROM information_schema.INNODB_LOCK_WAITS w
             JOIN information_schema.INNODB_TRX r ON r.trx_id = w.requesting_trx_id
             JOIN information_schema.INNODB_TRX b ON b.trx_id = w.blocking_trx_id
            WHERE b.trx_mysql_thread_id = ? AND r.trx_state = 'LOCK WAIT' AND r.trx_rows_modified > 0`,
          [holderThread],
        )) as [{ rowsModified: number }[], unknown];
        if (rows.length > 0) return { rowsModified: Number(rows[0].rowsModified) };
        if (answered()) throw new Error(`the request ended before it waited on ${part.manufacturer} ${part.mpn}`);
        if (Date.now() > end) throw new Error(`nothing waited on ${part.manufacturer} ${part.mpn} within ${timeoutMs} ms`);
        // Not faster: InnoDB refreshes what INNODB_TRX shows only when it was last read over 0.1 s ago
        // (its trx_i_s cache), so a tighter poll would read the same stale picture forever.
        await new Promise((r) => setTimeout(r, 150));
      }
    },
    async release() {
      await holder.rollback();
    },
    close() {
      holder.destroy();
      watcher.destroy();
    },
  };
}

/**
 * Sends a request (`send`, e.g. an import) and resolves once it waits on `hold`, its answer still to
 * come, with the rows its transaction had changed by then. A request that answers first fails the wait
 * with what it answered.
 */
export async function blockedOn(
  hold: PartKeyHold,
  send: () => Promise<Response>,
  timeoutMs = 60_000,
): Promise<{ answer: Promise<Response>; rowsModified: number }> {
  let settled = false;
  let early: Response | null = null;
  const answer = send().then(
    (r) => ((settled = true), (early = r)),
    (err: unknown) => {
      settled = true;
      throw err;
    },
  );
  answer.catch(() => {}); // the caller awaits it; no unhandled rejection meanwhile
  try {
    const { rowsModified } = await hold.waitUntilBlocked(timeoutMs, () => settled);
    return { answer, rowsModified };
  } catch (err) {
    const r = early as Response | null;
    if (r) throw new Error(`${(err as Error).message}; it answered ${r.status} ${(await r.clone().text()).slice(0, 500)}`);
    throw err;
  }
}

/** State letters of every thread of `pid` (from /proc: T = stopped). */
function threadStates(pid: number): string[] {
  return readdirSync(`/proc/${pid}/task`).map((tid) => {
    try {
      return readFileSync(`/proc/${pid}/task/${tid}/stat`, 'utf8').replace(/^.*\) /s, '')[0];
    } catch {
      return 'T'; // a thread that ended meanwhile
    }
  });
}

/**
 * SIGSTOP, and wait until every thread of the process has actually stopped: the signal is only queued
 * by kill(), and a thread already on a CPU could still answer a query in the meantime.
 */
export async function freeze(pid: number): Promise<void> {
  process.kill(pid, 'SIGSTOP');
  const end = Date.now() + 5_000;
  while (!threadStates(pid).every((s) => s === 'T' || s === 't')) {
    if (Date.now() > end) throw new Error(`process ${pid} did not stop`);
    await new Promise((r) => setTimeout(r, 10));
  }
}
