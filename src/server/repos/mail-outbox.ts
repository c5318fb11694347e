/** E-mail waiting to go out (see the mail_outbox migration). */
import type { Db } from '../db.ts';
import type { MailAttachment, MailMessage } from '../mail/messages.ts';

export type OutboxState = 'pending' | 'delivered' | 'failed';

export interface OutboxMail {
  id: number;
  idempotencyKey: string;
  kind: string;
  refId: number | null;
  to: string;
  message: MailMessage;
  state: OutboxState;
  attempts: number;
}

/** How the mail of one record stands, for the people who wait on it. */
export interface OutboxStatus {
  state: OutboxState;
  attempts: number;
  deliveredAt: string | null;
  nextAttemptAt: string | null;
  lastError: string | null;
}

/** Inside the caller's transaction: the mail, pending. A repeated key fails with ER_DUP_ENTRY. */
export async function insertOutboxMail(
  trx: Db,
  m: { idempotencyKey: string; kind: string; refId: number | null; to: string; message: MailMessage },
): Promise<number> {
  const [id] = await trx('mail_outbox').insert({
    idempotency_key: m.idempotencyKey,
    kind: m.kind,
    ref_id: m.refId,
    to_address: m.to,
    subject: m.message.subject,
    text_body: m.message.text,
    html_body: m.message.html,
    attachments_json: m.message.attachments?.length ? JSON.stringify(m.message.attachments) : null,
  });
  return Number(id);
}

/* eslint-disable @typescript-eslint/no-explicit-any -- rows straight from knex */
function fromRow(r: any): OutboxMail {
  return {
    id: r.id,
    idempotencyKey: r.idempotency_key,
    kind: r.kind,
    refId: r.ref_id,
    to: r.to_address,
    message: {
      subject: r.subject,
      text: r.text_body,
      html: r.html_body,
      ...(r.attachments_json ? { attachments: JSON.parse(r.attachments_json) as MailAttachment[] } : {}),
    },
    state: r.state,
    attempts: r.attempts,
  };
}

function statusFromRow(r: any): OutboxStatus {
  const iso = (d: Date | null) => (d ? new Date(d).toISOString() : null);
  return {
    state: r.state,
    attempts: r.attempts,
    deliveredAt: iso(r.delivered_at),
    nextAttemptAt: r.state === 'pending' ? iso(r.next_attempt_at) : null,
    lastError: r.state === 'delivered' ? null : r.last_error,
  };
}
/* eslint-enable @typescript-eslint/no-explicit-any */

/** The pending row held by this claim, or null (delivered or taken meanwhile). */
export async function claimedOutboxMail(db: Db, id: number, token: string): Promise<OutboxMail | null> {
  const row = await db('mail_outbox').where({ id, claimed_by: token, state: 'pending' }).first();
  return row ? fromRow(row) : null;
}

/** Marks the row delivered, only by the holder of its claim; false when the claim was lost. */
export async function markOutboxDelivered(db: Db, id: number, token: string, at: Date): Promise<boolean> {
  const n = await db('mail_outbox')
    .where({ id, claimed_by: token, state: 'pending' })
    .update({
      state: 'delivered',
      delivered_at: at,
      attempts: db.raw('attempts + 1'),
      claimed_by: null,
      claimed_until: null,
      last_error: null,
    });
  return Number(n) === 1;
}

export async function outboxIdByKey(db: Db, idempotencyKey: string): Promise<number | null> {
  const row = await db('mail_outbox').where({ idempotency_key: idempotencyKey }).first('id');
  return row ? (row.id as number) : null;
}

/** The mail status of each record of one kind (records without a row are absent). */
export async function outboxStatusByRef(db: Db, kind: string, refIds: readonly number[]): Promise<Map<number, OutboxStatus>> {
  const out = new Map<number, OutboxStatus>();
  if (refIds.length === 0) return out;
  const rows = await db('mail_outbox')
    .where({ kind })
    .whereIn('ref_id', [...new Set(refIds)]);
  for (const r of rows) out.set(r.ref_id as number, statusFromRow(r));
  return out;
}
