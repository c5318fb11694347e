/**
 * Side effects that must follow a commit, never precede it: e-mail recorded in mail_outbox and datasheet
 * objects recorded in blob_deletions, both written in the transaction of the change they belong to.
 * After commit the change's own request tries once at once; what fails stays recorded and the background
 * runs (src/server/outbox/schedule.ts) retry it with backoff. Each row is claimed by one UPDATE before it
 * is worked on (src/server/repos/claims.ts), so two servers never deliver or delete the same row at once.
 * A claim runs out after CLAIM_LEASE_MS, which frees the rows of a server that died mid-run; the one case
 * that can still repeat a mail is a server dying after the SMTP server took the mail and before the row
 * was marked: the retry then carries the same Message-ID, so the receiving side can drop it.
 */
import { createHash, randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from '../db.ts';
import { appConfig, type MailConfig, type OutboxConfig, type StorageConfig } from '../config.ts';
import { sendMail } from '../mail/send.ts';
import { claimNextDue, recordFailedTry } from '../repos/claims.ts';
import { claimedOutboxMail, markOutboxDelivered } from '../repos/mail-outbox.ts';
import { claimedBlobDeletion, finishBlobDeletion, type StoreKind } from '../repos/blob-deletions.ts';
import { datasheetStore, type BlobStore } from '../storage/index.ts';

/** How long one claim holds a row: longer than one SMTP delivery or object deletion can take. */
export const CLAIM_LEASE_MS = 5 * 60_000;
/** Retries back off by doubling from OUTBOX_RETRY_BASE_S up to this. */
export const RETRY_CAP_MS = 60 * 60_000;
/** Rows one run works through at most (the rest wait for the next run). */
const BATCH = 100;

/** Wait after the n-th failed try (n ≥ 1): base × 2^(n−1), at most an hour. */
export function retryDelayMs(failedTries: number, baseS: number): number {
  return Math.min(RETRY_CAP_MS, baseS * 1000 * 2 ** Math.max(0, failedTries - 1));
}

const message = (err: unknown): string => (err instanceof Error ? err.message : String(err));
const server = `${process.pid}-${randomUUID().slice(0, 8)}`;
const newToken = (): string => `${server}:${randomUUID()}`;

/** The Message-ID of an outbox mail: the same on every try. */
export function outboxMessageId(idempotencyKey: string, from: string): string {
  const domain = /@([A-Za-z0-9.-]+)>?\s*$/.exec(from)?.[1] ?? 'stallpoint.invalid';
  return `<outbox-${createHash('sha256').update(idempotencyKey).digest('hex').slice(0, 32)}@${domain}>`;
}

export interface RunOptions {
  db?: Knex;
  now?: () => Date;
  outbox?: OutboxConfig;
}

export interface MailRunOptions extends RunOptions {
  mail?: MailConfig;
  /** Only this outbox row (the send that just committed). */
  onlyId?: number;
}

/** Delivers due pending mail; how many were delivered and how many tries failed. */
export async function deliverPendingMail(o: MailRunOptions = {}): Promise<{ delivered: number; failed: number }> {
  const k = o.db ?? db();
  const now = o.now ?? (() => new Date());
  const config = o.outbox ?? appConfig().outbox;
  const mail = o.mail ?? appConfig().mail;
  let delivered = 0;
  let failed = 0;
  for (let i = 0; i < BATCH; i++) {
    const token = newToken();
    const due: Record<string, string | number> = o.onlyId === undefined ? { state: 'pending' } : { state: 'pending', id: o.onlyId };
    const id = await claimNextDue(k, 'mail_outbox', { token, now: now(), leaseMs: CLAIM_LEASE_MS }, due);
    if (id === null) break;
    const row = await claimedOutboxMail(k, id, token);
    if (!row) continue;
    try {
      await sendMail(row.to, row.message, { config: mail, messageId: outboxMessageId(row.idempotencyKey, mail.from) });
    } catch (err) {
      const tries = row.attempts + 1;
      const giveUp = tries >= config.mailAttempts;
      console.warn(
        `[outbox] mail ${row.id} (${row.message.subject}) not delivered, try ${tries}${giveUp ? ', giving up' : ''}: ${message(err)}`,
      );
      await recordFailedTry(k, 'mail_outbox', id, token, {
        error: message(err),
        nextAttemptAt: new Date(now().getTime() + retryDelayMs(tries, config.retryBaseS)),
        giveUp,
      });
      failed += 1;
      continue;
    }
    if (await markOutboxDelivered(k, id, token, now())) delivered += 1;
    if (o.onlyId !== undefined) break;
  }
  return { delivered, failed };
}

export interface BlobRunOptions extends RunOptions {
  store?: BlobStore;
  kind?: StoreKind;
  onlyId?: number;
}

const storeKind = (s: StorageConfig): StoreKind => s.kind;

/** Deletes the due objects still to be deleted from this server's store; how many went and how many tries failed. */
export async function deletePendingBlobs(o: BlobRunOptions = {}): Promise<{ deleted: number; failed: number }> {
  const k = o.db ?? db();
  const now = o.now ?? (() => new Date());
  const config = o.outbox ?? appConfig().outbox;
  const store = o.store ?? datasheetStore();
  const kind = o.kind ?? storeKind(appConfig().storage);
  let deleted = 0;
  let failed = 0;
  for (let i = 0; i < BATCH; i++) {
    const token = newToken();
    const due: Record<string, string | number> = o.onlyId === undefined ? { store: kind } : { store: kind, id: o.onlyId };
    const id = await claimNextDue(k, 'blob_deletions', { token, now: now(), leaseMs: CLAIM_LEASE_MS }, due);
    if (id === null) break;
    const row = await claimedBlobDeletion(k, id, token);
    if (!row) continue;
    try {
      await store.delete(row.storageKey);
    } catch (err) {
      const tries = row.attempts + 1;
      console.warn(`[outbox] object ${row.storageKey} not deleted, try ${tries}: ${message(err)}`);
      await recordFailedTry(k, 'blob_deletions', id, token, {
        error: message(err),
        nextAttemptAt: new Date(now().getTime() + retryDelayMs(tries, config.retryBaseS)),
      });
      failed += 1;
      continue;
    }
    if (await finishBlobDeletion(k, id, token)) deleted += 1;
    if (o.onlyId !== undefined) break;
  }
  return { deleted, failed };
}
