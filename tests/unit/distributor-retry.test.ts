/**
 * When the distributor client tries again and how long it waits. Retry-After examples are the two in
 * RFC 9110 §10.2.3 ("Fri, 31 Dec 1999 23:59:59 GMT" and "120"); which statuses are worth a retry (429 and
 * 5xx, never another 4xx) is common practice; the backoff ceilings are worked out by hand beside each row.
 */
import { describe, expect, it } from 'vitest';
import { isRetryableStatus, retryAfterMs, retryDelayMs } from '../../src/server/distributor/retry.ts';

describe('isRetryableStatus', () => {
  it.each([
    [429, true],
    [500, true],
    [502, true],
    [503, true],
    [504, true],
    [400, false],
    [401, false],
    [403, false],
    [404, false],
    [422, false],
  ])('%i → %s', (status, expected) => expect(isRetryableStatus(status)).toBe(expected));
});

describe('retryAfterMs (RFC 9110 §10.2.3)', () => {
  const at = Date.UTC(1999, 11, 31, 23, 57, 59); // two minutes before the RFC's date
  it.each([
    ['120', 120_000], // the RFC's delay-seconds example
    ['0', 0],
    [' 7 ', 7_000],
    ['Fri, 31 Dec 1999 23:59:59 GMT', 120_000], // the RFC's HTTP-date example, 2 min after `at`
    ['Fri, 31 Dec 1999 23:50:00 GMT', 0], // a date already past: go now
  ])('%j → %i ms', (header, expected) => expect(retryAfterMs(header, at)).toBe(expected));

  it.each([[null], [undefined], [''], ['soon'], ['-5'], ['1.5'], ['Fri, 31 Dec 1999 23:59:59']])('%j → null', (header) =>
    expect(retryAfterMs(header, at)).toBeNull(),
  );
});

describe('retryDelayMs', () => {
  const options = { baseDelayMs: 200, maxDelayMs: 2_000, retryAfterCapMs: 5_000 };
  it.each([
    // retry, random, expected: floor(random × min(2000, 200 × 2^(retry−1)))
    [1, 0.5, 100], // 0.5 × 200
    [2, 0.5, 200], // 0.5 × 400
    [3, 0.999, 799], // 0.999 × 800 = 799.2
    [4, 0.25, 400], // 0.25 × 1600
    [5, 0.5, 1_000], // 3200 capped at 2000, × 0.5
    [9, 0, 0], // full jitter may retry at once
  ])('retry %i with random %f waits %i ms', (retry, random, expected) => expect(retryDelayMs(retry, null, options, random)).toBe(expected));

  it('takes the server’s Retry-After over the backoff, up to the cap', () => {
    expect(retryDelayMs(1, 3_000, options, 0.5)).toBe(3_000);
    expect(retryDelayMs(1, 120_000, options, 0.5)).toBe(5_000);
    expect(retryDelayMs(1, 0, options, 0.5)).toBe(0);
  });
});
