/**
 * npm run db:restore <file>: loads a dump made by `npm run db:backup` into the app database (configured
 * as for `npm start`: .env, the environment winning). Every table in the dump is dropped and recreated
 * with the dump's rows; the database must be running.
 */
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { restoreDatabase } from './stack/db-dump.ts';
import { parseEnv } from './stack/env-file.ts';
import { describeError, log } from './stack/log.ts';

try {
  const arg = process.argv[2];
  if (!arg) throw new Error('usage: npm run db:restore -- <backup file>');
  const file = path.resolve(arg);
  if (!existsSync(file)) throw new Error(`no such backup file: ${file}`);
  if (existsSync('.env')) for (const [k, v] of Object.entries(parseEnv(readFileSync('.env', 'utf8')))) process.env[k] ??= v;
  await restoreDatabase(process.env, file);
  log(`restored ${file}`);
} catch (err) {
  console.error(`[stallpoint] restore failed: ${describeError(err)}`);
  process.exitCode = 1;
}
