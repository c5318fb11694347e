/**
 * Extra app server processes for the multi-server API tests: each is scripts/stack/app-server.ts (the
 * process `npm start` supervises) forked with tsx, on a free port of its own, against the same test
 * database, mail sink and (unless `env` names another) distributor as the suite's server. The test
 * decides what each one runs in the background through `env` (e.g. DISTRIBUTOR_REFRESH_MIN,
 * ALERT_SWEEP_S). stopAll() ends them (SIGTERM, SIGKILL after 15 s); any still alive when the test
 * worker exits are killed then.
 */
import { fork, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { freePort } from '../../scripts/stack/throwaway.ts';
import type { AppServerMessage } from '../../scripts/stack/app-server.ts';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

export interface AppProcess {
  url: string;
  pid: number;
  child: ChildProcess;
  /** Everything the process printed so far. */
  output(): string;
  /** Resolves once the process has ended. */
  exited: Promise<void>;
}

const alive = new Set<ChildProcess>();
process.once('exit', () => {
  for (const c of alive) c.kill('SIGKILL');
});

async function startOne(env: NodeJS.ProcessEnv, label: string): Promise<AppProcess> {
  const child = fork(path.join(root, 'scripts', 'stack', 'app-server.ts'), [], {
    cwd: root,
    env: { ...process.env, HOST: '127.0.0.1', PORT: String(await freePort()), SHUTDOWN_GRACE_S: '2', ...env },
    execArgv: ['--import', 'tsx'],
    stdio: ['ignore', 'pipe', 'pipe', 'ipc'],
  });
  alive.add(child);
  let out = '';
  child.stdout!.on('data', (c: Buffer) => (out += c.toString()));
  child.stderr!.on('data', (c: Buffer) => (out += c.toString()));
  const exited = new Promise<void>((resolve) =>
    child.once('exit', () => {
      alive.delete(child);
      resolve();
    }),
  );
  const url = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`${label} did not listen within 60 s:\n${out.slice(-2000)}`)), 60_000);
    void exited.then(() => reject(new Error(`${label} ended while starting:\n${out.slice(-2000)}`)));
    child.on('message', (m: AppServerMessage) => {
      clearTimeout(timer);
      if (m.type === 'listening') resolve(m.url);
      else reject(new Error(`${label} failed to start: ${m.message}`));
    });
  });
  return { url, pid: child.pid!, child, output: () => out, exited };
}

/** Starts `n` app server processes (one after another, as servers of one site come up) with `env` on top of the suite's. */
export async function startAppProcesses(n: number, env: NodeJS.ProcessEnv = {}): Promise<AppProcess[]> {
  const started: AppProcess[] = [];
  try {
    for (let i = 0; i < n; i++) started.push(await startOne(env, `app process ${i + 1}`));
  } catch (err) {
    await stopAll(started);
    throw err;
  }
  return started;
}

/** SIGTERM each (graceful stop), SIGKILL any that has not ended 15 s later; also fine for ones already dead. */
export async function stopAll(procs: AppProcess[]): Promise<void> {
  await Promise.all(
    procs.map(async (p) => {
      if (p.child.exitCode !== null || p.child.signalCode !== null) return;
      const force = setTimeout(() => p.child.kill('SIGKILL'), 15_000);
      p.child.kill('SIGTERM');
      await p.exited;
      clearTimeout(force);
    }),
  );
}
