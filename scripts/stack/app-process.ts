/**
 * `npm start`'s side of the app server: runs scripts/stack/app-server.ts in a child Node process (so a
 * crash of the app, an out-of-memory one included, cannot take MariaDB and the supervisor with it) and
 * waits until it listens. stopAppServer sends SIGTERM and waits for the child's graceful exit, with a
 * margin over the grace before it kills.
 */
import { fork, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import type { AppServerMessage } from './app-server.ts';
import { StackError } from './log.ts';

/** `onChild` hears of the child the moment it is spawned (so a signal during start-up can still stop it). */
export async function spawnAppServer(
  root: string,
  env: NodeJS.ProcessEnv,
  onChild: (child: ChildProcess) => void = () => {},
): Promise<{ child: ChildProcess; url: string }> {
  const child = fork(path.join(root, 'scripts', 'stack', 'app-server.ts'), [], {
    cwd: root,
    env,
    execArgv: ['--import', 'tsx'],
    stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
  });
  onChild(child);
  const url = await new Promise<string>((resolve, reject) => {
    const onExit = (code: number | null, signal: NodeJS.Signals | null): void =>
      reject(new StackError(`the app server ended while starting (${signal ?? `exit code ${code}`})`));
    child.once('exit', onExit);
    child.on('message', (m: AppServerMessage) => {
      if (m.type === 'listening') {
        child.off('exit', onExit);
        resolve(m.url);
      } else if (m.type === 'failed') {
        child.off('exit', onExit);
        const inUse = m.code === 'EADDRINUSE';
        reject(
          new StackError(
            inUse ? `${m.message}: is Stallpoint already running? Stop the other server or set PORT to a free one.` : m.message,
          ),
        );
      }
    });
  });
  return { child, url };
}

/** SIGTERM, then wait for the child's own graceful stop; SIGKILL when it has not ended `graceMs` + 10 s later. */
export function stopAppServer(child: ChildProcess, graceMs: number): Promise<void> {
  return new Promise<void>((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null) return resolve();
    const force = setTimeout(() => child.kill('SIGKILL'), graceMs + 10_000);
    child.once('exit', () => {
      clearTimeout(force);
      resolve();
    });
    child.kill('SIGTERM');
  });
}
