/**
 * npm test: the npm start bootstrap on a throwaway data folder and free ports, then vitest
 * (unit, API against the real MariaDB, browser tests in Debian's Chromium). Everything started here
 * is stopped again, also when a test fails; the exit code is vitest's.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { spawn, spawnSync } from 'node:child_process';
import { CHROMIUM, ensureChromium, startThrowawayStack, type ThrowawayStack } from './throwaway.ts';
import { log } from './log.ts';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
process.chdir(root);

function runVitest(env: NodeJS.ProcessEnv, args: string[]): Promise<number> {
  return new Promise((resolve) => {
    const child = spawn('npx', ['vitest', 'run', ...args], { cwd: root, stdio: 'inherit', env });
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
}

let stack: ThrowawayStack | null = null;
let exitCode = 1;
const stop = async (code: number): Promise<never> => {
  await stack?.cleanup();
  process.exit(code);
};
process.on('SIGINT', () => void stop(130));
process.on('SIGTERM', () => void stop(143));

/** Type errors fail the run before anything starts (vitest itself does not type-check). */
function typeCheck(): boolean {
  log('type-checking (tsc --noEmit)…');
  const r = spawnSync('npx', ['tsc', '--noEmit', '-p', 'tsconfig.json'], { cwd: root, stdio: 'inherit' });
  return r.status === 0;
}

try {
  if (!typeCheck()) throw new Error('TypeScript reported errors (see above).');
  ensureChromium();
  stack = await startThrowawayStack(root);
  log(`test server at ${stack.url}, MariaDB on port ${stack.env.MARIADB_PORT}`);
  exitCode = await runVitest(
    { ...stack.env, TEST_ARTIFACTS_DIR: path.join(root, 'test-results'), CHROMIUM_PATH: CHROMIUM },
    process.argv.slice(2),
  );
} catch (err) {
  console.error(err);
  exitCode = 1;
} finally {
  await stack?.cleanup();
}
process.exit(exitCode);
