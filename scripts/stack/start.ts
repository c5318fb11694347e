/**
 * npm start: private MariaDB on loopback, migrations, demo seed, build when needed, serve.
 * Ctrl-C / SIGTERM (also during start-up): in-flight requests finish, the knex pool closes, and what
 * this run started stops again (a MariaDB it found running and reused is left running), exit 0.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { mkdirSync } from 'node:fs';
import { ensureEnvFile } from './env-file.ts';
import { describeInstance, ensureDatabaseAndUser, ensureMariaDbInstalled, initDataDir, startMariaDb } from './mariadb.ts';
import { migrateAndSeed } from './db-setup.ts';
import { buildIfChanged } from './build.ts';
import { startHttpServer } from './serve.ts';
import { describeError, log } from './log.ts';
import { Teardown, stopOnSignals } from './teardown.ts';
import { demoPeople, DEMO_PASSWORD } from '../../db/seeds/demo.ts';
import { startServices } from './services.ts';
import { readConfig, resetAppConfig } from '../../src/server/config.ts';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
process.chdir(root);

const teardown = new Teardown();
stopOnSignals(
  teardown,
  (signal) => log(`${signal}: finishing requests and shutting down…`),
  () => 0,
);

async function main(): Promise<void> {
  const fileEnv = ensureEnvFile(path.join(root, '.env'));
  for (const [k, v] of Object.entries(fileEnv)) process.env[k] ??= v;
  process.env.ASTRO_TELEMETRY_DISABLED = '1';
  process.env.DATA_DIR ??= path.join(root, '.data');
  const config = readConfig(process.env);

  ensureMariaDbInstalled();
  mkdirSync(config.dataDir, { recursive: true });
  const db = describeInstance(path.join(config.dataDir, 'mariadb'), config.db.port);
  if (initDataDir(db)) log(`created a new MariaDB data folder at ${db.dataDir}`);
  const startedDb = await startMariaDb(db, teardown);
  ensureDatabaseAndUser(db, config.db.database, config.db.user, config.db.password);
  await migrateAndSeed(process.env, { seed: true });
  buildIfChanged(root);
  const services = await startServices(process.env);
  teardown.add('mail sink', () => services.close());
  Object.assign(process.env, services.env);
  resetAppConfig();
  let http;
  try {
    http = await startHttpServer(path.join(root, 'dist'), config.host, config.port);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'EADDRINUSE') {
      throw new Error(`port ${config.port} is in use (is Stallpoint already running?): stop the other server or set PORT to a free one.`);
    }
    throw err;
  }
  teardown.add('web server', () => http.close());

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
