/**
 * Backup and restore of the app database with MariaDB's own client tools from the Debian package
 * (mariadb-dump --single-transaction: a consistent snapshot without locking the app out; the mariadb
 * client to load it). The credentials go in a private option file for the call, never on the command
 * line. A dump is written to a temporary name and renamed when complete, so a cut-off run leaves no
 * file that looks like a backup.
 */
import { spawn } from 'node:child_process';
import { createReadStream, createWriteStream, mkdtempSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { once } from 'node:events';
import { readConfig, type DbConfig } from '../../src/server/config.ts';
import { fail } from './log.ts';

const optionValue = (v: string): string => `"${v.replace(/\\/g, '\\\\').replace(/"/g, '\\"')}"`;

/** Runs `fn` with a [client] option file (mode 0600) holding the app user's connection. */
async function withOptionFile<T>(db: DbConfig, fn: (file: string) => Promise<T>): Promise<T> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'stallpoint-dbopt-'));
  const file = path.join(dir, 'client.cnf');
  const lines = ['[client]', `host=${db.host}`, `port=${db.port}`, `user=${optionValue(db.user)}`, `password=${optionValue(db.password)}`];
  writeFileSync(file, lines.join('\n') + '\n', { mode: 0o600 });
  try {
    return await fn(file);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

async function run(cmd: string, args: string[], stdin: NodeJS.ReadableStream | null, stdout: NodeJS.WritableStream | null): Promise<void> {
  const child = spawn(cmd, args, { stdio: [stdin ? 'pipe' : 'ignore', stdout ? 'pipe' : 'ignore', 'pipe'] });
  let stderr = '';
  child.stderr!.on('data', (c: Buffer) => (stderr += c.toString()));
  if (stdin) stdin.pipe(child.stdin!);
  if (stdout) child.stdout!.pipe(stdout);
  const [code, error] = await Promise.race([
    once(child, 'close') as Promise<[number | null]>,
    once(child, 'error').then(([e]) => [null, e as Error] as const),
  ]);
  if (error) fail(`${cmd} could not run: ${error.message} (install the Debian package "mariadb-client")`);
  if (code !== 0) fail(`${cmd} failed (exit code ${code}): ${stderr.trim()}`);
}

/** Dumps the app database (structure and rows) to `file`; resolves with its path. */
export async function backupDatabase(env: NodeJS.ProcessEnv, file: string): Promise<string> {
  const { db } = readConfig(env);
  const partial = `${file}.partial`;
  await withOptionFile(db, async (options) => {
    const out = createWriteStream(partial, { mode: 0o600 });
    const args = [
      `--defaults-file=${options}`,
      '--single-transaction',
      '--quick',
      '--triggers',
      '--no-tablespaces',
      '--hex-blob',
      '--default-character-set=utf8mb4',
      db.database,
    ];
    try {
      const written = once(out, 'close');
      await run('mariadb-dump', args, null, out);
      await written; // the pipe ends the file when the dump's output ends
    } catch (err) {
      out.destroy();
      rmSync(partial, { force: true });
      throw err;
    }
  });
  renameSync(partial, file);
  return file;
}

/** Loads a dump made by backupDatabase into the app database, replacing the tables it holds. */
export async function restoreDatabase(env: NodeJS.ProcessEnv, file: string): Promise<void> {
  const { db } = readConfig(env);
  await withOptionFile(db, (options) =>
    run('mariadb', [`--defaults-file=${options}`, '--default-character-set=utf8mb4', db.database], createReadStream(file), null),
  );
}
