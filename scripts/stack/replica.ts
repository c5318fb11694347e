/**
 * A read replica of the private MariaDB, on loopback, with MariaDB's own replication: the primary writes
 * a binary log with GTIDs (scripts/stack/mariadb.ts starts every private instance that way); the replica
 * is a second private mariadbd (its own data folder and port, read_only, following only the app's
 * database), loaded from a consistent dump of the primary that carries the GTID position
 * (`mariadb-dump --single-transaction --gtid --master-data`), then pointed at the primary with
 * `CHANGE MASTER TO … MASTER_USE_GTID=slave_pos` and `START SLAVE`. Started by the tests that need one
 * (tests/api/replica.test.ts) and by `npm start` with DB_REPLICA_HOST=local (loaded afresh on every start);
 * in production the replica is yours to run and DB_REPLICA_HOST names it.
 */
import { spawn, spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import {
  describeInstance,
  ensureDatabaseAndUser,
  initDataDir,
  rootSql,
  startMariaDb,
  stopMariaDb,
  type MariaDbInstance,
} from './mariadb.ts';
import { StackError } from './log.ts';
import type { Teardown } from './teardown.ts';

export const REPLICATION_USER = 'stallpoint_repl';

export interface ReplicaOptions {
  primary: MariaDbInstance;
  dataDir: string;
  port: number;
  /** The app's database, user and password (the same on the replica). */
  database: string;
  user: string;
  password: string;
  teardown?: Teardown | null;
}

const quote = (s: string): string => `'${s.replace(/\\/g, '\\\\').replace(/'/g, "\\'")}'`;

/** mariadb-dump of the app's database on the primary, piped straight into the replica (root over the sockets). */
function copyDatabase(primary: MariaDbInstance, replica: MariaDbInstance, database: string): Promise<void> {
  return new Promise((resolve, reject) => {
    const dump = spawn(
      'mariadb-dump',
      [
        '--no-defaults',
        `--socket=${primary.socketPath}`,
        '-uroot',
        '--single-transaction',
        '--gtid',
        '--master-data=1',
        '--routines',
        // No triggers on the replica: the primary logs rows (--binlog-format=ROW), so its catalogue_version
        // rows arrive as row events, and a replica trigger (run as the app user) could only refuse under
        // read_only any local write made there.
        '--skip-triggers',
        '--databases',
        database,
      ],
      { stdio: ['ignore', 'pipe', 'pipe'] },
    );
    const load = spawn('mariadb', ['--no-defaults', `--socket=${replica.socketPath}`, '-uroot'], { stdio: ['pipe', 'ignore', 'pipe'] });
    let errors = '';
    dump.stderr.on('data', (d: Buffer) => (errors += d.toString()));
    load.stderr.on('data', (d: Buffer) => (errors += d.toString()));
    dump.stdout.pipe(load.stdin);
    let pending = 2;
    let failed = false;
    const done = (what: string) => (code: number | null) => {
      if (code !== 0 && !failed) {
        failed = true;
        reject(new StackError(`${what} failed while copying ${database} to the replica: ${errors.trim()}`));
      }
      if (--pending === 0 && !failed) resolve();
    };
    dump.on('exit', done('mariadb-dump'));
    load.on('exit', done('mariadb (loading the dump)'));
  });
}

export interface ReplicaStatus {
  ioRunning: string;
  sqlRunning: string;
  lastError: string;
}

export function replicaStatus(replica: MariaDbInstance): ReplicaStatus {
  const r = spawnSync('mariadb', ['--no-defaults', `--socket=${replica.socketPath}`, '-uroot', '-e', 'SHOW SLAVE STATUS\\G'], {
    encoding: 'utf8',
  });
  if (r.status !== 0) throw new StackError(`SHOW SLAVE STATUS failed: ${r.stderr.trim()}`);
  const out = r.stdout;
  const field = (name: string): string => new RegExp(`^\\s*${name}: (.*)$`, 'm').exec(out)?.[1]?.trim() ?? '';
  return {
    ioRunning: field('Slave_IO_Running'),
    sqlRunning: field('Slave_SQL_Running'),
    lastError: [field('Last_IO_Error'), field('Last_SQL_Error')].filter(Boolean).join('; '),
  };
}

/** Starts the replica and waits (at most 30 s) until both replication threads run. */
export async function startReplica(o: ReplicaOptions): Promise<MariaDbInstance> {
  const replica = describeInstance(o.dataDir, o.port);
  replica.serverId = 2;
  replica.extraArgs = ['--read-only', `--replicate-wild-do-table=${o.database}.%`, `--relay-log=${o.dataDir}/relay`, '--skip-slave-start'];
  initDataDir(replica);
  await startMariaDb(replica, o.teardown ?? null);
  try {
    const replPassword = randomBytes(18).toString('base64url');
    rootSql(
      o.primary,
      [
        `CREATE USER IF NOT EXISTS '${REPLICATION_USER}'@'127.0.0.1' IDENTIFIED BY ${quote(replPassword)};`,
        `ALTER USER '${REPLICATION_USER}'@'127.0.0.1' IDENTIFIED BY ${quote(replPassword)};`,
        `GRANT REPLICATION SLAVE ON *.* TO '${REPLICATION_USER}'@'127.0.0.1';`,
      ].join(' '),
    );
    ensureDatabaseAndUser(replica, o.database, o.user, o.password);
    // A replica kept from an earlier run is loaded afresh: replication stopped first (the dump sets its position).
    rootSql(replica, 'STOP ALL SLAVES; RESET SLAVE ALL;');
    await copyDatabase(o.primary, replica, o.database);
    rootSql(
      replica,
      `CHANGE MASTER TO MASTER_HOST='127.0.0.1', MASTER_PORT=${o.primary.port}, MASTER_USER='${REPLICATION_USER}', ` +
        `MASTER_PASSWORD=${quote(replPassword)}, MASTER_USE_GTID=slave_pos, MASTER_CONNECT_RETRY=1; START SLAVE;`,
    );
    const deadline = Date.now() + 30_000;
    for (;;) {
      const s = replicaStatus(replica);
      if (s.ioRunning === 'Yes' && s.sqlRunning === 'Yes') break;
      if ((s.lastError && (s.ioRunning === 'No' || s.sqlRunning === 'No')) || Date.now() > deadline)
        throw new StackError(`the replica on port ${o.port} does not follow the primary: ${s.lastError || JSON.stringify(s)}`);
      await new Promise((r) => setTimeout(r, 100));
    }
  } catch (err) {
    await stopMariaDb(replica);
    throw err;
  }
  return replica;
}
