/**
 * Claiming one due row of a retry table (mail_outbox, blob_deletions) for one run: a single UPDATE sets
 * claimed_by and claimed_until on the oldest due row that nobody holds (or whose claim has run out), so
 * two servers running at once never take the same row; the row is then read back by its claim.
 */
import type { Db } from '../db.ts';

export type ClaimTable = 'mail_outbox' | 'blob_deletions';

/** Claims the next due row; its id, or null when none is due. `due` adds the table's own condition. */
export async function claimNextDue(
  db: Db,
  table: ClaimTable,
  claim: { token: string; now: Date; leaseMs: number },
  due: Record<string, string | number> = {},
): Promise<number | null> {
  const claimed = await db(table)
    .where(due)
    .where('next_attempt_at', '<=', claim.now)
    .where((q) => q.whereNull('claimed_by').orWhere('claimed_until', '<', claim.now))
    .orderBy('id')
    .limit(1)
    .update({ claimed_by: claim.token, claimed_until: new Date(claim.now.getTime() + claim.leaseMs) });
  if (Number(claimed) === 0) return null;
  const row = await db(table).where({ claimed_by: claim.token }).first('id');
  return row ? (row.id as number) : null;
}

/** Records a failed try by the holder of the claim: attempts + 1, the error, the next try, the claim freed. */
export async function recordFailedTry(
  db: Db,
  table: ClaimTable,
  id: number,
  token: string,
  f: { error: string; nextAttemptAt: Date; giveUp?: boolean },
): Promise<boolean> {
  const n = await db(table)
    .where({ id, claimed_by: token })
    .update({
      attempts: db.raw('attempts + 1'),
      last_error: f.error.slice(0, 1000),
      next_attempt_at: f.nextAttemptAt,
      claimed_by: null,
      claimed_until: null,
      ...(f.giveUp ? { state: 'failed' } : {}),
    });
  return Number(n) === 1;
}
