/**
 * npm test: the npm start bootstrap on a throwaway data folder and free ports, then vitest
 * (unit, API against the real MariaDB, browser tests in Debian's Chromium). Everything started here
 * is stopped again, also when a test fails; the exit code is vitest's.
 */
import path from 'node:path';
import os from 'node:os';
import net from 'node:net';
import { fileURLToPath } from 'node:url';
import { existsSync, mkdtempSync, rmSync, mkdirSync } from 'node:fs';
import { spawn } from 'node:child_process';
import {
  aptInstall,
  describeInstance,
  ensureDatabaseAndUser,
  ensureMariaDbInstalled,
  initDataDir,
  startMariaDb,
  stopMariaDb,
  type MariaDbInstance,
} from './mariadb.ts';
import { generatedSecret } from './env-file.ts';
import { migrateAndSeed } from './db-setup.ts';
import { buildIfChanged } from './build.ts';
import { startHttpServer, type RunningServer } from './serve.ts';
import { startServices, type Services } from './services.ts';
import { log, fail } from './log.ts';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
process.chdir(root);
const CHROMIUM = '/usr/bin/chromium';

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address();
      srv.close(() => resolve(typeof addr === 'object' && addr ? addr.port : 0));
    });
  });
}

function ensureChromium(): void {
  if (existsSync(CHROMIUM)) return;
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  if (!isRoot) fail('Chromium is needed for the browser tests: install the Debian package "chromium".');
  log('installing chromium with apt-get (one time)…');
  aptInstall(['chromium']);
}

function runVitest(env: NodeJS.ProcessEnv, args: string[]): Promise<number> {
  return new Promise((resolve) => {
    const child = spawn('npx', ['vitest', 'run', ...args], { cwd: root, stdio: 'inherit', env });
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
}

const tmp = mkdtempSync(path.join(os.tmpdir(), 'stallpoint-test-'));
let db: MariaDbInstance | null = null;
let http: RunningServer | null = null;
let services: Services | null = null;
let exitCode = 1;

async function cleanup(): Promise<void> {
  await http?.close().catch(() => undefined);
  await services?.close().catch(() => undefined);
  if (db) await stopMariaDb(db).catch(() => undefined);
  rmSync(tmp, { recursive: true, force: true });
}

process.on('SIGINT', () => void cleanup().then(() => process.exit(130)));
process.on('SIGTERM', () => void cleanup().then(() => process.exit(143)));

try {
  ensureMariaDbInstalled();
  ensureChromium();
  const dbPort = await freePort();
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: 'test',
    ASTRO_TELEMETRY_DISABLED: '1',
    DB_HOST: '127.0.0.1',
    DB_PORT: String(dbPort),
    DB_NAME: 'stallpoint_test',
    DB_USER: 'stallpoint_test',
    DB_PASSWORD: generatedSecret(),
    DB_SCRATCH_NAME: 'stallpoint_scratch',
    DATA_DIR: path.join(tmp, 'data'),
  };
  Object.assign(process.env, env);
  mkdirSync(env.DATA_DIR!, { recursive: true });
  db = describeInstance(path.join(tmp, 'mariadb'), dbPort);
  initDataDir(db);
  await startMariaDb(db);
  ensureDatabaseAndUser(db, env.DB_NAME!, env.DB_USER!, env.DB_PASSWORD!);
  ensureDatabaseAndUser(db, env.DB_SCRATCH_NAME!, env.DB_USER!, env.DB_PASSWORD!);
  await migrateAndSeed(env, { seed: true });
  buildIfChanged(root);
  services = await startServices(env);
  Object.assign(env, services.env);
  Object.assign(process.env, services.env);
  http = await startHttpServer(path.join(root, 'dist'), '127.0.0.1', await freePort());
  log(`test server at ${http.url}, MariaDB on port ${dbPort}`);
  exitCode = await runVitest(
    {
      ...env,
      STALLPOINT_URL: http.url,
      MARIADB_DATADIR: db.dataDir,
      MARIADB_SOCKET: db.socketPath,
      MARIADB_PORT: String(dbPort),
      TEST_ARTIFACTS_DIR: path.join(root, 'test-results'),
      CHROMIUM_PATH: CHROMIUM,
    },
    process.argv.slice(2),
  );
} catch (err) {
  console.error(err);
  exitCode = 1;
} finally {
  await cleanup();
}
process.exit(exitCode);
