/**
 * A generic fixed-window rate limiter counted in MariaDB, so the limit holds across several app servers.
 * One row per bucket; the upsert is atomic, so concurrent requests cannot both take the last hit.
 *
 *   const verdict = await consume(db(), `calc:address:${ip}`, { limit: 60, windowSeconds: 60 });
 *   if (!verdict.allowed) return jsonError(429, '…', [], { 'Retry-After': String(verdict.retryAfterSeconds) });
 *
 * OWASP ASVS 5.0 V2.4.1 (anti-automation), V6.3.1 (brute-force protection for sign-in).
 */
import type { Knex } from 'knex';
import type { Db } from '../db.ts';

export interface RateLimit {
  /** Hits allowed per window. */
  limit: number;
  windowSeconds: number;
}

export interface RateVerdict {
  allowed: boolean;
  /** Hits counted in the current window, including this one. */
  hits: number;
  remaining: number;
  /** Seconds until the window ends (0 when allowed). */
  retryAfterSeconds: number;
}

interface BucketRow {
  window_started_at: Date;
  hits: number;
}

function transact<T>(db: Db, work: (trx: Knex.Transaction) => Promise<T>): Promise<T> {
  return db.isTransaction ? work(db as Knex.Transaction) : (db as Knex).transaction(work);
}

const isDeadlock = (err: unknown): boolean => (err as { errno?: number }).errno === 1213;

/** Counts one hit in the bucket and says whether it is within the limit. */
export async function consume(db: Db, bucketKey: string, rule: RateLimit, now: Date = new Date()): Promise<RateVerdict> {
  // Two first hits on a new bucket can deadlock on InnoDB's insert locks; MariaDB rolls one back: retry it.
  for (let attempt = 1; ; attempt++) {
    try {
      return await countHit(db, bucketKey, rule, now);
    } catch (err) {
      if (!isDeadlock(err) || attempt >= 5 || db.isTransaction) throw err;
    }
  }
}

async function countHit(db: Db, bucketKey: string, rule: RateLimit, now: Date): Promise<RateVerdict> {
  const staleBefore = new Date(now.getTime() - rule.windowSeconds * 1000);
  return transact(db, async (trx) => {
    // Assignments run left to right: `hits` still sees the old window start.
    await trx.raw(
      `insert into rate_limit_buckets (bucket_key, window_started_at, hits) values (?, ?, 1)
       on duplicate key update
         hits = if(window_started_at <= ?, 1, hits + 1),
         window_started_at = if(window_started_at <= ?, ?, window_started_at)`,
      [bucketKey, now, staleBefore, staleBefore, now],
    );
    const row: BucketRow = await trx('rate_limit_buckets').select('window_started_at', 'hits').where({ bucket_key: bucketKey }).first();
    return verdictOf(row, rule, now);
  });
}

function verdictOf(row: BucketRow, rule: RateLimit, now: Date): RateVerdict {
  const hits = Number(row.hits);
  const allowed = hits <= rule.limit;
  const windowEndsMs = new Date(row.window_started_at).getTime() + rule.windowSeconds * 1000;
  return {
    allowed,
    hits,
    remaining: Math.max(0, rule.limit - hits),
    retryAfterSeconds: allowed ? 0 : Math.max(1, Math.ceil((windowEndsMs - now.getTime()) / 1000)),
  };
}

/** Gives back one hit (e.g. a sign-in that succeeded should not count against the address). */
export async function refund(db: Db, bucketKey: string): Promise<void> {
  await db('rate_limit_buckets').where({ bucket_key: bucketKey }).where('hits', '>', 0).decrement('hits', 1);
}

/** Forgets a bucket (e.g. an account's failures once its owner signs in). */
export async function reset(db: Db, bucketKey: string): Promise<void> {
  await db('rate_limit_buckets').where({ bucket_key: bucketKey }).delete();
}

/** Deletes buckets whose window ended long ago; call now and then to keep the table small. */
export async function pruneBuckets(db: Db, olderThanSeconds: number, now: Date = new Date()): Promise<number> {
  return db('rate_limit_buckets')
    .where('window_started_at', '<', new Date(now.getTime() - olderThanSeconds * 1000))
    .delete();
}
