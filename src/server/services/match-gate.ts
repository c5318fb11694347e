/**
 * At most MATCH_CONCURRENCY design matches rank at once in this app server; one more is refused at
 * once with 429 and Retry-After instead of queueing behind the others (a queue would hold connections
 * and memory until every client times out). Sign-in, search and /api/health never wait on it.
 */
import { appConfig } from '../config.ts';
import { ServiceError } from './errors.ts';

let running = 0;

export const matchesRunning = (): number => running;

export async function withMatchSlot<T>(work: () => Promise<T>, limit: number = appConfig().matchConcurrency): Promise<T> {
  if (running >= limit) {
    throw new ServiceError(429, `The server is ranking ${running} designs already; try again in a moment.`, [], { 'Retry-After': '1' });
  }
  running++;
  try {
    return await work();
  } finally {
    running--;
  }
}
