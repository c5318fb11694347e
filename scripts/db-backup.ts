/**
 * npm run db:backup [-- file]: dumps the app database (the one `npm start` serves, configured as for it:
 * .env, the environment winning) to `file`, by default DATA_DIR/backups/stallpoint-<UTC time>.sql.
 * An existing file is never overwritten. The database must be running (npm start, or your own MariaDB).
 */
import path from 'node:path';
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import { backupDatabase } from './stack/db-dump.ts';
import { parseEnv } from './stack/env-file.ts';
import { describeError, log } from './stack/log.ts';
import { readConfig } from '../src/server/config.ts';

try {
  if (existsSync('.env')) for (const [k, v] of Object.entries(parseEnv(readFileSync('.env', 'utf8')))) process.env[k] ??= v;
  const { dataDir } = readConfig(process.env);
  const stamp = new Date().toISOString().replace(/[:]/g, '').replace(/\..*$/, 'Z');
  const file = path.resolve(process.argv[2] ?? path.join(dataDir, 'backups', `stallpoint-${stamp}.sql`));
  if (existsSync(file)) throw new Error(`${file} exists already; name a new file (a backup never overwrites one)`);
  mkdirSync(path.dirname(file), { recursive: true });
  await backupDatabase(process.env, file);
  log(`backup written to ${file}`);
} catch (err) {
  console.error(`[stallpoint] backup failed: ${describeError(err)}`);
  process.exitCode = 1;
}
