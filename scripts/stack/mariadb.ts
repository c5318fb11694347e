/**
 * A private MariaDB instance under a project folder, bound to 127.0.0.1.
 * Recipe: ../shared/stack.md ("MariaDB from Debian, private instance on loopback").
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, openSync } from 'node:fs';
import path from 'node:path';
import { log, fail } from './log.ts';
import type { Teardown } from './teardown.ts';
import { readConfig } from '../../src/server/config.ts';

export interface MariaDbInstance {
  dataDir: string;
  socketPath: string;
  port: number;
  pidFile: string;
  process: ChildProcess | null;
  /** Replication role: the private instance is a primary (server id 1, binary log on); a replica has its own id. */
  serverId: number;
  /** Extra server options (a replica's read_only and filters). */
  extraArgs: string[];
}

function which(cmd: string): boolean {
  return spawnSync('sh', ['-c', `command -v ${cmd}`], { stdio: 'ignore' }).status === 0;
}

/** Installs mariadb-server from Debian when missing and we are root; otherwise says what to install. */
export function ensureMariaDbInstalled(): void {
  if (which('mariadbd') && which('mariadb-install-db')) return;
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  if (!isRoot) {
    fail(
      'MariaDB is not installed. Install the Debian package "mariadb-server" ' +
        '(sudo apt-get install -y mariadb-server) and run this command again.',
    );
  }
  log('installing mariadb-server with apt-get (one time, about 30 s)…');
  aptInstall(['mariadb-server']);
  if (!which('mariadbd')) fail('apt-get finished but mariadbd is still missing.');
}

export function aptInstall(packages: string[]): void {
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  const update = spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
  if (update.status !== 0) fail('apt-get update failed.');
  const install = spawnSync('apt-get', ['install', '-y', '-qq', ...packages], { stdio: 'inherit', env });
  if (install.status !== 0) fail(`apt-get install ${packages.join(' ')} failed.`);
}

export function describeInstance(dataDir: string, port: number): MariaDbInstance {
  return {
    dataDir,
    socketPath: `${dataDir}.sock`,
    port,
    pidFile: `${dataDir}.pid`,
    process: null,
    serverId: 1,
    extraArgs: [],
  };
}

/** Creates the data directory on first run (system tables only, root password auth, no test db). */
export function initDataDir(db: MariaDbInstance): boolean {
  if (existsSync(path.join(db.dataDir, 'mysql'))) return false;
  mkdirSync(db.dataDir, { recursive: true });
  const res = spawnSync(
    'mariadb-install-db',
    [
      '--no-defaults',
      `--datadir=${db.dataDir}`,
      '--user=root',
      '--auth-root-authentication-method=normal',
      '--skip-test-db',
      '--skip-name-resolve',
    ],
    { encoding: 'utf8' },
  );
  if (res.status !== 0) fail(`mariadb-install-db failed:\n${res.stdout}\n${res.stderr}`);
  return true;
}

function alive(db: MariaDbInstance): boolean {
  return adminPing(db);
}

export function adminPing(db: MariaDbInstance): boolean {
  const r = spawnSync('mariadb-admin', ['--no-defaults', `--socket=${db.socketPath}`, '-uroot', 'ping'], {
    stdio: 'ignore',
  });
  return r.status === 0;
}

/**
 * Starts mariadbd (or reuses one already serving this data dir) and waits until it answers. True when
 * started here. A MariaDB started here is added to `teardown` the moment it is spawned (so a signal
 * while it boots still stops it); a reused one never is.
 */
export async function startMariaDb(db: MariaDbInstance, teardown: Teardown | null = null): Promise<boolean> {
  if (alive(db)) {
    log(`reusing the MariaDB already running on ${db.socketPath}`);
    return false;
  }
  const errLog = openSync(`${db.dataDir}.err`, 'a');
  const child = spawn(
    'mariadbd',
    [
      '--no-defaults',
      `--datadir=${db.dataDir}`,
      `--socket=${db.socketPath}`,
      `--port=${db.port}`,
      '--bind-address=127.0.0.1',
      '--user=root',
      '--skip-name-resolve',
      `--pid-file=${db.pidFile}`,
      `--log-error=${db.dataDir}.err`,
      '--character-set-server=utf8mb4',
      '--collation-server=utf8mb4_unicode_ci',
      `--innodb-buffer-pool-size=${readConfig(process.env).dbBufferPoolSize}`,
      '--innodb-log-file-size=16M',
      // Binary log (row events, GTIDs) so a replica can follow this instance (scripts/stack/replica.ts).
      `--server-id=${db.serverId}`,
      `--log-bin=${path.join(db.dataDir, 'binlog')}`,
      '--binlog-format=ROW',
      '--binlog-expire-logs-seconds=259200',
      // The catalogue-version triggers (db/migrations/…_create_catalogue_version.ts) with the binary log on.
      '--log-bin-trust-function-creators=1',
      ...db.extraArgs,
    ],
    { stdio: ['ignore', errLog, errLog], detached: false },
  );
  db.process = child;
  teardown?.add(`MariaDB on port ${db.port}`, () => stopMariaDb(db));
  let exited = false;
  child.once('exit', () => (exited = true));
  const deadline = Date.now() + 60_000;
  while (!alive(db)) {
    if (exited || Date.now() > deadline) {
      const tail = existsSync(`${db.dataDir}.err`) ? readFileSync(`${db.dataDir}.err`, 'utf8').slice(-2000) : '';
      if (!exited) child.kill('SIGKILL');
      fail(`MariaDB did not start on port ${db.port}.\n${tail}`);
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  return true;
}

/** Runs SQL as root over the socket. */
export function rootSql(db: MariaDbInstance, sql: string): string {
  const r = spawnSync('mariadb', ['--no-defaults', `--socket=${db.socketPath}`, '-uroot', '-N', '-e', sql], {
    encoding: 'utf8',
  });
  if (r.status !== 0) fail(`SQL failed: ${r.stderr.trim()}`);
  return r.stdout;
}

const ident = (s: string): string => {
  if (!/^[A-Za-z0-9_]+$/.test(s)) fail(`invalid identifier: ${s}`);
  return s;
};

/** Creates the database and an app user limited to it (idempotent; resets the password to the given one). */
export function ensureDatabaseAndUser(db: MariaDbInstance, name: string, user: string, password: string): void {
  const pw = password.replace(/\\/g, '\\\\').replace(/'/g, "\\'");
  rootSql(
    db,
    [
      `CREATE DATABASE IF NOT EXISTS \`${ident(name)}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`,
      `CREATE USER IF NOT EXISTS '${ident(user)}'@'127.0.0.1' IDENTIFIED BY '${pw}';`,
      `ALTER USER '${ident(user)}'@'127.0.0.1' IDENTIFIED BY '${pw}';`,
      `GRANT ALL PRIVILEGES ON \`${ident(name)}\`.* TO '${ident(user)}'@'127.0.0.1';`,
      'FLUSH PRIVILEGES;',
      // An instance started earlier without the flag (reused): the catalogue-version triggers need it.
      'SET GLOBAL log_bin_trust_function_creators = 1;',
    ].join(' '),
  );
}

/** Clean shutdown through mariadb-admin; waits for the process to exit. One still booting is terminated. */
export async function stopMariaDb(db: MariaDbInstance): Promise<void> {
  const child = db.process;
  if (!alive(db)) {
    if (child && child.exitCode === null && child.signalCode === null) {
      child.kill('SIGTERM');
      await new Promise<void>((resolve) => {
        const force = setTimeout(() => (child.kill('SIGKILL'), resolve()), 30_000);
        child.once('exit', () => (clearTimeout(force), resolve()));
      });
    }
    return;
  }
  spawnSync('mariadb-admin', ['--no-defaults', `--socket=${db.socketPath}`, '-uroot', 'shutdown'], {
    stdio: 'ignore',
  });
  const deadline = Date.now() + 30_000;
  while (existsSync(db.pidFile) && Date.now() < deadline) {
    await new Promise((r) => setTimeout(r, 100));
  }
}
