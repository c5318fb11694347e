/**
 * npm start: private MariaDB on loopback, migrations, demo seed, build when needed, serve.
 * Supervision: the app server runs in a child process (app-server.ts) and is started again after a
 * crash; the MariaDB this run started is started again after a crash (not after a clean shutdown
 * someone asked for), both with backoff (supervisor.ts), every exit and restart logged.
 * Ctrl-C / SIGTERM (also during start-up): the app server stops accepting, requests in flight finish
 * (up to SHUTDOWN_GRACE_S), the knex pool closes, and what this run started stops again (a MariaDB it
 * found running and reused is left running), exit 0.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { mkdirSync } from 'node:fs';
import type { ChildProcess } from 'node:child_process';
import { ensureEnvFile } from './env-file.ts';
import {
  describeInstance,
  ensureDatabaseAndUser,
  ensureMariaDbInstalled,
  initDataDir,
  startMariaDb,
  type MariaDbInstance,
} from './mariadb.ts';
import { migrateAndSeed } from './db-setup.ts';
import { buildIfChanged } from './build.ts';
import { spawnAppServer, stopAppServer } from './app-process.ts';
import { Supervisor } from './supervisor.ts';
import { describeError, log } from './log.ts';
import { Teardown, stopOnSignals } from './teardown.ts';
import { demoPeople, DEMO_PASSWORD } from '../../db/seeds/demo.ts';
import { startServices } from './services.ts';
import { startReplica } from './replica.ts';
import { readConfig, resetAppConfig } from '../../src/server/config.ts';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
process.chdir(root);

const teardown = new Teardown();
stopOnSignals(
  teardown,
  (signal) => log(`${signal}: finishing requests and shutting down…`),
  () => 0,
);

// Whatever happens, the app server child does not outlive this process.
let appChild: ChildProcess | null = null;
process.on('exit', () => appChild?.kill('SIGKILL'));

/** Restarts the MariaDB this run started when it dies (a clean shutdown someone asked for is left alone). */
function superviseMariaDb(db: MariaDbInstance): void {
  const supervisor = new Supervisor({
    name: 'MariaDB',
    isCrash: (code, signal) => signal !== null || code !== 0,
    restart: async () => ((await startMariaDb(db)) ? db.process : null),
  });
  supervisor.watch(db.process!);
  // Added after the MariaDB step, so it runs first: no restart while the teardown shuts MariaDB down.
  teardown.add('MariaDB supervision', () => supervisor.stop());
}

async function main(): Promise<void> {
  // With DB_PASSWORD in the environment (e.g. a test's own stack) no .env is read or written.
  const fileEnv = process.env.DB_PASSWORD ? {} : ensureEnvFile(path.join(root, '.env'));
  for (const [k, v] of Object.entries(fileEnv)) process.env[k] ??= v;
  process.env.ASTRO_TELEMETRY_DISABLED = '1';
  process.env.DATA_DIR ??= path.join(root, '.data');
  const config = readConfig(process.env);

  ensureMariaDbInstalled();
  mkdirSync(config.dataDir, { recursive: true });
  const db = describeInstance(path.join(config.dataDir, 'mariadb'), config.db.port);
  if (initDataDir(db)) log(`created a new MariaDB data folder at ${db.dataDir}`);
  const startedDb = await startMariaDb(db, teardown);
  if (startedDb) superviseMariaDb(db);
  ensureDatabaseAndUser(db, config.db.database, config.db.user, config.db.password);
  await migrateAndSeed(process.env, { seed: true });
  if (config.dbReplica?.local) {
    // Loaded afresh from the primary on every start (a dump with the GTID position), then following it.
    const replica = await startReplica({
      primary: db,
      dataDir: path.join(config.dataDir, 'mariadb-replica'),
      port: config.dbReplica.port,
      database: config.db.database,
      user: config.db.user,
      password: config.db.password,
      teardown,
    });
    log(`read replica on 127.0.0.1:${replica.port} following the primary (search and catalogue reads)`);
  }
  buildIfChanged(root);
  const services = await startServices(process.env);
  teardown.add('local services (mail sink, fake S3, fake distributor)', () => services.close());
  Object.assign(process.env, services.env);
  resetAppConfig();
  const graceMs = readConfig(process.env).shutdownGraceS * 1000;
  const track = (child: ChildProcess): void => void (appChild = child);
  const first = await spawnAppServer(root, process.env, track);
  log(`app server pid ${first.child.pid}`);
  const app = new Supervisor({
    name: 'app server',
    restart: async () => (await spawnAppServer(root, process.env, track)).child,
  });
  app.watch(first.child);
  teardown.add('web server', () => app.stop((child) => stopAppServer(child, graceMs)));
  const http = { url: first.url };

  console.log('');
  log(`Stallpoint is running at ${http.url}`);
  log(`MariaDB on 127.0.0.1:${db.port}, data in ${db.dataDir}${startedDb ? '' : ' (already running before; left running on exit)'}`);
  log(`demo sign-ins (demo only), password "${DEMO_PASSWORD}":`);
  for (const p of demoPeople) log(`  ${p.email.padEnd(36)} ${p.roles.join(', ')}`);
  log('press Ctrl-C to stop');
}

try {
  await main();
} catch (err) {
  console.error(`[stallpoint] could not start: ${describeError(err)}`);
  await teardown.run();
  process.exit(1);
}
