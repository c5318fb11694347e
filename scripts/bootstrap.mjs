// Installs npm packages when node_modules is missing or older than package-lock.json.
import { existsSync, statSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

function needsInstall() {
  const stamp = path.join(projectRoot, 'node_modules', '.package-lock.json');
  const lock = path.join(projectRoot, 'package-lock.json');
  if (!existsSync(stamp)) return true;
  return statSync(stamp).mtimeMs < statSync(lock).mtimeMs;
}

export async function ensureNodeModules() {
  if (!needsInstall()) return;
  console.log('[stallpoint] installing npm packages (npm ci)…');
  const result = spawnSync('npm', ['ci', '--no-audit', '--no-fund'], { cwd: projectRoot, stdio: 'inherit' });
  if (result.status !== 0) {
    throw new Error('npm ci failed; see the output above.');
  }
}
