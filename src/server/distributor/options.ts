/** The client settings the app uses, from the configuration. */
import type { AppConfig } from '../config.ts';
import type { ClientOptions } from './client.ts';

/** Backoff scale and the longest Retry-After honoured, ms (the README's DISTRIBUTOR_RETRIES row states the cap). */
export const BASE_DELAY_MS = 500;
export const MAX_DELAY_MS = 8_000;
export const RETRY_AFTER_CAP_MS = 30_000;

export function clientOptions(baseUrl: string, config: AppConfig): ClientOptions {
  return {
    baseUrl,
    timeoutMs: config.distributor.timeoutMs,
    retries: config.distributor.retries,
    baseDelayMs: BASE_DELAY_MS,
    maxDelayMs: MAX_DELAY_MS,
    retryAfterCapMs: RETRY_AFTER_CAP_MS,
  };
}
