/**
 * Rate limit for the open calculator endpoints: per client address, per minute.
 * Counted in process for now (calculators are stateless and cheap); see README "Scaling out".
 */
import { ServiceError } from './errors.ts';
import { appConfig } from '../config.ts';

const WINDOW_MS = 60_000;
const hits = new Map<string, { start: number; count: number }>();

/** Counts one request; throws a 429 ServiceError (with Retry-After) over the limit. */
export function limitCalculator(clientAddress: string, nowMs = Date.now()): void {
  const key = clientAddress || 'unknown';
  const entry = hits.get(key);
  if (!entry || nowMs - entry.start >= WINDOW_MS) {
    if (hits.size > 10_000) hits.clear();
    hits.set(key, { start: nowMs, count: 1 });
    return;
  }
  entry.count += 1;
  if (entry.count <= appConfig().calcRateLimitPerMin) return;
  const retryAfterS = Math.ceil((entry.start + WINDOW_MS - nowMs) / 1000);
  throw new ServiceError(429, 'Too many calculator requests from this address; wait a moment and try again.', [], {
    'Retry-After': String(retryAfterS),
  });
}
