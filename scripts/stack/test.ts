/**
 * npm test: the npm start bootstrap on a throwaway data folder and free ports, then vitest
 * (unit, API against the real MariaDB, browser tests in Debian's Chromium), after prettier, eslint and tsc. Everything started here
 * is stopped again, also when a test fails or a signal arrives during start-up; the exit code is vitest's.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { spawn, spawnSync } from 'node:child_process';
import { CHROMIUM, ensureChromium, startThrowawayStack } from './throwaway.ts';
import { describeError, log, StackError } from './log.ts';
import { Teardown, stopOnSignals } from './teardown.ts';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
process.chdir(root);

const teardown = new Teardown();
stopOnSignals(
  teardown,
  (signal) => log(`${signal}: stopping the throwaway stack…`),
  (signal) => (signal === 'SIGINT' ? 130 : 143),
);

function runVitest(env: NodeJS.ProcessEnv, args: string[]): Promise<number> {
  return new Promise((resolve) => {
    const child = spawn('npx', ['vitest', 'run', ...args], { cwd: root, stdio: 'inherit', env });
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
}

/** A check that runs before anything starts (vitest itself does not type-check or lint). */
function gate(title: string, cmd: string, args: string[]): void {
  log(`${title}…`);
  const r = spawnSync(cmd, args, { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) throw new StackError(`${title} reported problems (see above).`);
}

let exitCode = 1;
try {
  gate('checking format and lint (npm run lint)', 'npm', ['run', '--silent', 'lint']);
  gate('type-checking (tsc --noEmit)', 'npx', ['tsc', '--noEmit', '-p', 'tsconfig.json']);
  ensureChromium();
  const stack = await startThrowawayStack(root, teardown);
  log(`test server at ${stack.url}, MariaDB on port ${stack.env.MARIADB_PORT}`);
  exitCode = await runVitest(
    { ...stack.env, TEST_ARTIFACTS_DIR: path.join(root, 'test-results'), CHROMIUM_PATH: CHROMIUM },
    process.argv.slice(2),
  );
} catch (err) {
  console.error(`[stallpoint] ${describeError(err)}`);
  exitCode = 1;
} finally {
  await teardown.run();
}
process.exit(exitCode);
