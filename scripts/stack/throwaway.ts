/**
 * A complete throwaway stack for tests and benchmarks: private MariaDB on a free port under a temp folder,
 * migrated and seeded, local service fakes, and the built app on a free port. cleanup() stops it all.
 */
import path from 'node:path';
import os from 'node:os';
import net from 'node:net';
import { existsSync, mkdtempSync, rmSync, mkdirSync } from 'node:fs';
import {
  aptInstall,
  describeInstance,
  ensureDatabaseAndUser,
  ensureMariaDbInstalled,
  initDataDir,
  startMariaDb,
  type MariaDbInstance,
} from './mariadb.ts';
import { generatedSecret } from './env-file.ts';
import { migrateAndSeed } from './db-setup.ts';
import { buildIfChanged } from './build.ts';
import { startHttpServer } from './serve.ts';
import { startServices } from './services.ts';
import { Teardown } from './teardown.ts';
import { resetAppConfig } from '../../src/server/config.ts';
import { log, fail } from './log.ts';

export const CHROMIUM = '/usr/bin/chromium';

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address();
      srv.close(() => resolve(typeof addr === 'object' && addr ? addr.port : 0));
    });
  });
}

export function ensureChromium(): void {
  if (existsSync(CHROMIUM)) return;
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  if (!isRoot) fail('Chromium is needed for the browser tests: install the Debian package "chromium".');
  log('installing chromium with apt-get (one time)…');
  aptInstall(['chromium']);
}

export interface ThrowawayStack {
  env: NodeJS.ProcessEnv;
  url: string;
  db: MariaDbInstance;
  cleanup(): Promise<void>;
}

/**
 * Starts the stack, adding each piece to `teardown` the moment it starts, so a caller's signal handler
 * can stop a half-started stack. cleanup() runs that teardown.
 */
export async function startThrowawayStack(root: string, teardown: Teardown = new Teardown()): Promise<ThrowawayStack> {
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'stallpoint-test-'));
  teardown.add('throwaway folder', () => rmSync(tmp, { recursive: true, force: true }));
  const cleanup = (): Promise<void> => teardown.run();
  try {
    ensureMariaDbInstalled();
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
      DB_SNAPSHOT_NAME: 'stallpoint_seeded',
      DATA_DIR: path.join(tmp, 'data'),
    };
    Object.assign(process.env, env);
    mkdirSync(env.DATA_DIR!, { recursive: true });
    const db = describeInstance(path.join(tmp, 'mariadb'), dbPort);
    initDataDir(db);
    await startMariaDb(db, teardown);
    ensureDatabaseAndUser(db, env.DB_NAME!, env.DB_USER!, env.DB_PASSWORD!);
    ensureDatabaseAndUser(db, env.DB_SCRATCH_NAME!, env.DB_USER!, env.DB_PASSWORD!);
    ensureDatabaseAndUser(db, env.DB_SNAPSHOT_NAME!, env.DB_USER!, env.DB_PASSWORD!);
    await migrateAndSeed(env, { seed: true, snapshotTo: env.DB_SNAPSHOT_NAME });
    buildIfChanged(root);
    const services = await startServices(env);
    teardown.add('local services (mail sink, fake S3, fake distributor)', () => services.close());
    Object.assign(env, services.env);
    Object.assign(process.env, services.env);
    resetAppConfig();
    const http = await startHttpServer(path.join(root, 'dist'), '127.0.0.1', await freePort());
    teardown.add('web server', async () => void (await http.close(10_000)));
    return {
      env: { ...env, STALLPOINT_URL: http.url, MARIADB_DATADIR: db.dataDir, MARIADB_SOCKET: db.socketPath, MARIADB_PORT: String(dbPort) },
      url: http.url,
      db,
      cleanup,
    };
  } catch (err) {
    await cleanup();
    throw err;
  }
}
