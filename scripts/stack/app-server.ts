/**
 * The app server process that `npm start` runs and supervises (scripts/stack/app-process.ts): serves
 * dist/ on HOST:PORT and tells the parent over IPC once it listens. SIGTERM or SIGINT: stop accepting,
 * let requests in flight finish for up to SHUTDOWN_GRACE_S, close the knex pool, exit 0. When the parent
 * goes away it stops the same way. A crash (an uncaught error, the heap running out) ends the process
 * and the parent starts a new one.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { startHttpServer } from './serve.ts';
import { readConfig } from '../../src/server/config.ts';
import { log } from './log.ts';

export type AppServerMessage = { type: 'listening'; url: string } | { type: 'failed'; code: string | null; message: string };

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const send = (m: AppServerMessage): void => void process.send?.(m);

const config = readConfig(process.env);
let http: Awaited<ReturnType<typeof startHttpServer>>;
try {
  http = await startHttpServer(path.join(root, 'dist'), config.host, config.port);
} catch (err) {
  const e = err as NodeJS.ErrnoException;
  send({ type: 'failed', code: e.code ?? null, message: e.message });
  process.exit(1);
}
send({ type: 'listening', url: http.url });

let stopping = false;
async function stop(why: string): Promise<void> {
  if (stopping) return;
  stopping = true;
  log(`app server: ${why}; finishing requests in flight (up to ${config.shutdownGraceS} s)…`);
  const allFinished = await http.close(config.shutdownGraceS * 1000);
  log(allFinished ? 'app server: every request finished; stopped' : 'app server: grace over, cut the requests still open; stopped');
  process.exit(0);
}
process.on('SIGTERM', () => void stop('SIGTERM'));
process.on('SIGINT', () => void stop('SIGINT'));
process.on('disconnect', () => void stop('the supervising process went away'));
