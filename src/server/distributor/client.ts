/**
 * The distributor client: asks a distributor's offers API (the local fake under `npm start`/`npm test`)
 * for the offers on a batch of part numbers. Each attempt has its own timeout; 429 and 5xx are tried again
 * a bounded number of times with exponential backoff and jitter, honouring Retry-After (capped); other
 * 4xx, an unreadable body and a body of the wrong shape fail at once. A body whose list holds some broken
 * offers keeps the valid ones and reports the rest.
 */
import { z } from 'zod';
import { isRetryableStatus, retryAfterMs, retryDelayMs, type BackoffOptions } from './retry.ts';

const priceBreakSchema = z.object({ qty: z.number().int().min(1), unitPrice: z.number().nonnegative().finite() });

export const offerSchema = z.object({
  mpn: z.string().min(1).max(80),
  sku: z.string().min(1).max(80),
  stock: z.number().int().min(0),
  moq: z.number().int().min(1).default(1),
  currency: z.string().regex(/^[A-Z]{3}$/),
  leadTimeDays: z.number().int().min(0).nullable().default(null),
  priceBreaks: z.array(priceBreakSchema).max(20),
});
export type DistributorOffer = z.infer<typeof offerSchema>;

/** The envelope: the list itself is checked offer by offer, so one broken offer does not sink the rest. */
const envelopeSchema = z.object({ distributor: z.string().min(1).max(120), offers: z.array(z.unknown()).max(1000) });

export interface RejectedOffer {
  index: number;
  mpn: string | null;
  problems: string[];
}

export interface OffersResult {
  distributor: string;
  offers: DistributorOffer[];
  rejected: RejectedOffer[];
  attempts: number;
}

export type DistributorErrorKind = 'timeout' | 'network' | 'http' | 'malformed';

export class DistributorError extends Error {
  constructor(
    readonly kind: DistributorErrorKind,
    message: string,
    readonly attempts: number,
    readonly status: number | null = null,
  ) {
    super(message);
    this.name = 'DistributorError';
  }
}

export interface ClientOptions extends BackoffOptions {
  baseUrl: string;
  /** Deadline of one attempt (connect, answer and body), ms. */
  timeoutMs: number;
  /** Further attempts after the first, on 429, 5xx, a timeout or a dropped connection. */
  retries: number;
  /** Waits between attempts (tests may pass a recording one); default setTimeout. */
  sleep?: (ms: number) => Promise<void>;
  /** Source of jitter in [0, 1); default Math.random. */
  random?: () => number;
  now?: () => number;
}

const defaultSleep = (ms: number): Promise<void> => new Promise((resolve) => setTimeout(resolve, ms));

/** Keeps the valid offers of a list and names what is wrong with each of the others. */
export function splitOffers(list: unknown[]): { offers: DistributorOffer[]; rejected: RejectedOffer[] } {
  const offers: DistributorOffer[] = [];
  const rejected: RejectedOffer[] = [];
  list.forEach((item, index) => {
    const parsed = offerSchema.safeParse(item);
    if (parsed.success) return void offers.push(parsed.data);
    const mpn =
      typeof item === 'object' && item !== null && typeof (item as { mpn?: unknown }).mpn === 'string'
        ? (item as { mpn: string }).mpn
        : null;
    rejected.push({ index, mpn, problems: parsed.error.issues.map((i) => `${i.path.join('.') || '(offer)'}: ${i.message}`) });
  });
  return { offers, rejected };
}

type Attempt = { ok: true; body: unknown } | { ok: false; error: DistributorError; retryable: boolean; retryAfter: number | null };

async function attempt(url: string, options: ClientOptions, n: number): Promise<Attempt> {
  const now = options.now ?? Date.now;
  let res: Response;
  let text: string;
  try {
    res = await fetch(url, { headers: { Accept: 'application/json' }, signal: AbortSignal.timeout(options.timeoutMs) });
    text = await res.text();
  } catch (err) {
    const e = err as Error;
    const timedOut = e.name === 'TimeoutError' || e.name === 'AbortError';
    return {
      ok: false,
      retryable: true,
      retryAfter: null,
      error: timedOut
        ? new DistributorError('timeout', `no answer within ${options.timeoutMs} ms`, n)
        : new DistributorError('network', `could not reach the distributor: ${e.message}`, n),
    };
  }
  if (!res.ok) {
    return {
      ok: false,
      retryable: isRetryableStatus(res.status),
      retryAfter: retryAfterMs(res.headers.get('retry-after'), now()),
      error: new DistributorError('http', `the distributor answered ${res.status}`, n, res.status),
    };
  }
  try {
    return { ok: true, body: JSON.parse(text) };
  } catch {
    return {
      ok: false,
      retryable: false,
      retryAfter: null,
      error: new DistributorError('malformed', 'the answer is not JSON', n, res.status),
    };
  }
}

/** The distributor's offers on these part numbers (≤ 50 per call); throws DistributorError when it cannot. */
export async function fetchOffers(mpns: string[], options: ClientOptions): Promise<OffersResult> {
  const url = new URL('/v1/offers', options.baseUrl);
  for (const m of mpns) url.searchParams.append('mpn', m);
  const sleep = options.sleep ?? defaultSleep;
  const random = options.random ?? Math.random;
  for (let n = 1; ; n++) {
    const result = await attempt(url.href, options, n);
    if (result.ok) {
      const envelope = envelopeSchema.safeParse(result.body);
      if (!envelope.success) {
        const where = envelope.error.issues.map((i) => i.path.join('.') || '(body)').join(', ');
        throw new DistributorError('malformed', `the answer is not the agreed shape (${where})`, n, 200);
      }
      return { distributor: envelope.data.distributor, ...splitOffers(envelope.data.offers), attempts: n };
    }
    if (!result.retryable || n > options.retries) {
      const e = result.error;
      throw new DistributorError(e.kind, n > 1 ? `${e.message} (${n} attempts)` : e.message, n, e.status);
    }
    await sleep(retryDelayMs(n, result.retryAfter, options, random()));
  }
}
