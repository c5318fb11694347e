/**
 * Builds the Astro app when its sources or the configuration the build bakes in (PUBLIC_URL, read by
 * astro.config.mjs) changed since the last build (hash stamp in dist/).
 */
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { log, fail } from './log.ts';
import { buildTimeConfig } from '../../src/server/config.ts';

const INPUTS = ['src', 'public', 'db', 'astro.config.mjs', 'package-lock.json', 'tsconfig.json', 'knexfile.ts'];

function walk(p: string, files: string[]): void {
  if (!existsSync(p)) return;
  const st = statSync(p);
  if (st.isFile()) {
    files.push(p);
    return;
  }
  for (const name of readdirSync(p).sort()) walk(path.join(p, name), files);
}

export function sourceHash(root: string, env: NodeJS.ProcessEnv = process.env): string {
  const files: string[] = [];
  for (const input of INPUTS) walk(path.join(root, input), files);
  const h = createHash('sha256');
  h.update(JSON.stringify(buildTimeConfig(env)));
  for (const f of files) {
    h.update(path.relative(root, f));
    h.update(readFileSync(f));
  }
  return h.digest('hex');
}

export function buildIfChanged(root: string): void {
  const stamp = path.join(root, 'dist', '.source-hash');
  const hash = sourceHash(root);
  const entry = path.join(root, 'dist', 'server', 'entry.mjs');
  if (existsSync(entry) && existsSync(stamp) && readFileSync(stamp, 'utf8') === hash) return;
  log('building the app (sources changed)…');
  const res = spawnSync('npx', ['astro', 'build'], {
    cwd: root,
    stdio: ['ignore', 'pipe', 'inherit'],
    env: { ...process.env, ASTRO_TELEMETRY_DISABLED: '1' },
    encoding: 'utf8',
  });
  if (res.status !== 0) {
    console.log(res.stdout);
    fail('astro build failed.');
  }
  writeFileSync(stamp, hash);
}
