/**
 * When to try a distributor request again: which answers are worth another try, how long Retry-After
 * asks us to wait (RFC 9110 §10.2.3: delay-seconds or an HTTP-date), and exponential backoff with full
 * jitter when the server names no delay.
 */

/** 429 and every 5xx are worth another try; other 4xx would answer the same again. */
export function isRetryableStatus(status: number): boolean {
  return status === 429 || (status >= 500 && status <= 599);
}

/**
 * The wait a Retry-After header asks for, in ms (0 for a date already past), or null when it is absent or
 * neither delay-seconds nor an HTTP-date.
 */
export function retryAfterMs(header: string | null | undefined, nowMs: number): number | null {
  if (header === null || header === undefined) return null;
  const text = header.trim();
  if (/^\d+$/.test(text)) return Number(text) * 1000;
  // An HTTP-date names its weekday and GMT ("Wed, 21 Oct 2026 07:28:00 GMT"); Date.parse reads it.
  if (!/GMT$/.test(text)) return null;
  const at = Date.parse(text);
  if (!Number.isFinite(at)) return null;
  return Math.max(0, at - nowMs);
}

export interface BackoffOptions {
  /** Delay scale of the first retry, ms. */
  baseDelayMs: number;
  /** No computed backoff is longer than this, ms. */
  maxDelayMs: number;
  /** The longest Retry-After honoured, ms: a server asking for longer gets this and then the error stands. */
  retryAfterCapMs: number;
}

/**
 * The wait before retry number `retry` (1 for the first): the server's Retry-After when it gave one
 * (capped), otherwise full jitter, random × min(max, base × 2^(retry−1)). `random` is in [0, 1).
 */
export function retryDelayMs(retry: number, retryAfter: number | null, options: BackoffOptions, random: number): number {
  if (retryAfter !== null) return Math.min(retryAfter, options.retryAfterCapMs);
  const ceiling = Math.min(options.maxDelayMs, options.baseDelayMs * 2 ** (retry - 1));
  return Math.floor(random * ceiling);
}
