/**
 * npm start: private MariaDB on loopback, migrations, demo seed, build when needed, serve.
 * Ctrl-C / SIGTERM: in-flight requests finish, the knex pool closes, MariaDB shuts down, exit 0.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { mkdirSync } from 'node:fs';
import { ensureEnvFile } from './env-file.ts';
import {
  describeInstance,
  ensureDatabaseAndUser,
  ensureMariaDbInstalled,
  initDataDir,
  startMariaDb,
  stopMariaDb,
} from './mariadb.ts';
import { migrateAndSeed } from './db-setup.ts';
import { buildIfChanged } from './build.ts';
import { startHttpServer, type RunningServer } from './serve.ts';
import { fail, log } from './log.ts';
import { demoPeople, DEMO_PASSWORD } from '../../db/seeds/demo.ts';
import { startServices, type Services } from './services.ts';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
process.chdir(root);

const fileEnv = ensureEnvFile(path.join(root, '.env'));
for (const [k, v] of Object.entries(fileEnv)) process.env[k] ??= v;
process.env.ASTRO_TELEMETRY_DISABLED = '1';
process.env.DB_HOST ??= '127.0.0.1';
process.env.DB_PORT ??= '3407';
process.env.DB_NAME ??= 'stallpoint';
process.env.DB_USER ??= 'stallpoint';
process.env.DATA_DIR ??= path.join(root, '.data');
const host = process.env.HOST ?? '127.0.0.1';
const port = Number(process.env.PORT ?? 4321);

ensureMariaDbInstalled();
mkdirSync(process.env.DATA_DIR, { recursive: true });
const db = describeInstance(path.join(process.env.DATA_DIR, 'mariadb'), Number(process.env.DB_PORT));
let startedDb = false;
let services: Services | null = null;
let http: RunningServer | null = null;

try {
  if (initDataDir(db)) log(`created a new MariaDB data folder at ${db.dataDir}`);
  startedDb = await startMariaDb(db);
  ensureDatabaseAndUser(db, process.env.DB_NAME, process.env.DB_USER, process.env.DB_PASSWORD ?? '');
  await migrateAndSeed(process.env, { seed: true });
  buildIfChanged(root);
  services = await startServices(process.env);
  Object.assign(process.env, services.env);
  http = await startHttpServer(path.join(root, 'dist'), host, port);
} catch (err) {
  const e = err as NodeJS.ErrnoException;
  const message = e.code === 'EADDRINUSE'
    ? `port ${port} is in use (is Stallpoint already running?): stop the other server or set PORT to a free one.`
    : e.message;
  await services?.close().catch(() => undefined);
  if (startedDb) await stopMariaDb(db);
  fail(`could not start: ${message}`);
}

console.log('');
log(`Stallpoint is running at ${http.url}`);
log(`MariaDB on 127.0.0.1:${db.port}, data in ${db.dataDir}`);
log(`demo sign-ins (demo only), password "${DEMO_PASSWORD}":`);
for (const p of demoPeople) log(`  ${p.email.padEnd(36)} ${p.roles.join(', ')}`);
log('press Ctrl-C to stop');

let stopping = false;
async function shutdown(signal: string): Promise<void> {
  if (stopping) return;
  stopping = true;
  log(`${signal}: finishing requests and shutting down…`);
  await http?.close();
  await services?.close();
  await stopMariaDb(db);
  log('stopped cleanly');
  process.exit(0);
}
process.on('SIGINT', () => void shutdown('SIGINT'));
process.on('SIGTERM', () => void shutdown('SIGTERM'));
