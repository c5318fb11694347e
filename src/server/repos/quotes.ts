/** Supplier contacts and requests for quotation with their lines (see the migration's comments). */
import type { Db } from '../db.ts';
import type { PreferenceLine } from './shortlist-preferences.ts';
import { isoDate } from './part-mapping.ts';

export type QuoteState = 'sent' | 'answered' | 'closed';

/** mail_outbox.kind of the mail that carries a request for quotation (ref_id = quote_requests.id). */
export const QUOTE_MAIL_KIND = 'quote_request';

export interface SupplierContact {
  id: number;
  name: string;
  company: string;
  email: string;
  updatedAt: string;
}

export interface QuoteLineAnswer {
  unitPrice: number;
  currency: string;
  moq: number;
  leadTimeDays: number;
  validUntil: string;
}

export interface QuoteLine {
  id: number;
  lineNo: number;
  designId: number | null;
  designName: string | null;
  line: PreferenceLine;
  partId: number;
  mpn: string;
  manufacturer: string;
  qtyNeeded: number;
  orderQty: number;
  notes: string | null;
  answer: QuoteLineAnswer | null;
  sourceId: number | null;
}

export interface QuoteRequest {
  id: number;
  state: QuoteState;
  contact: SupplierContact;
  notes: string | null;
  wantedBy: string | null;
  createdByName: string | null;
  sentAt: string;
  answeredAt: string | null;
  closedAt: string | null;
  lineCount: number;
  /** The request's e-mail: pending until the SMTP server took it, delivered, or failed after the last try. */
  mail: { state: 'pending' | 'delivered' | 'failed'; attempts: number; deliveredAt: string | null; lastError: string | null } | null;
}

export interface QuoteRequestDetail extends QuoteRequest {
  lines: QuoteLine[];
}

/* eslint-disable @typescript-eslint/no-explicit-any -- rows straight from knex */
const iso = (d: Date | null): string | null => (d ? new Date(d).toISOString() : null);
const day = (d: Date | string | null): string | null => (d === null ? null : (isoDate(d) as string));

function contactFromRow(r: any): SupplierContact {
  return { id: r.id, name: r.name, company: r.company, email: r.email, updatedAt: iso(r.updated_at)! };
}

export async function listContacts(db: Db): Promise<SupplierContact[]> {
  return (await db('supplier_contacts').orderBy(['company', 'name'])).map(contactFromRow);
}

export async function findContact(db: Db, id: number, lock = false): Promise<SupplierContact | null> {
  const q = db('supplier_contacts').where({ id });
  const row = await (lock ? q.forUpdate() : q).first();
  return row ? contactFromRow(row) : null;
}

export async function contactIdByEmail(db: Db, email: string): Promise<number | null> {
  const row = await db('supplier_contacts').where({ email }).first('id');
  return row ? (row.id as number) : null;
}

export async function insertContact(trx: Db, c: { name: string; company: string; email: string; createdBy: number }): Promise<number> {
  const [id] = await trx('supplier_contacts').insert({ name: c.name, company: c.company, email: c.email, created_by: c.createdBy });
  return Number(id);
}

export async function updateContact(trx: Db, id: number, c: { name: string; company: string; email: string }): Promise<void> {
  await trx('supplier_contacts')
    .where({ id })
    .update({ ...c, updated_at: trx.fn.now(3) });
}

const quoteColumns = (db: Db) => [
  'q.*',
  'u.name as created_by_name',
  'c.name as c_name',
  'c.company as c_company',
  'c.email as c_email',
  'c.updated_at as c_updated_at',
  'o.state as mail_state',
  'o.attempts as mail_attempts',
  'o.delivered_at as mail_delivered_at',
  'o.last_error as mail_last_error',
  db.raw('(select count(*) from quote_request_lines l where l.quote_request_id = q.id) as line_count'),
];

function quoteFromRow(r: any): QuoteRequest {
  return {
    id: r.id,
    state: r.state,
    contact: contactFromRow({ id: r.contact_id, name: r.c_name, company: r.c_company, email: r.c_email, updated_at: r.c_updated_at }),
    notes: r.notes,
    wantedBy: day(r.wanted_by),
    createdByName: r.created_by_name ?? null,
    sentAt: iso(r.sent_at)!,
    answeredAt: iso(r.answered_at),
    closedAt: iso(r.closed_at),
    lineCount: Number(r.line_count),
    mail: r.mail_state
      ? {
          state: r.mail_state,
          attempts: r.mail_attempts,
          deliveredAt: iso(r.mail_delivered_at),
          lastError: r.mail_state === 'delivered' ? null : (r.mail_last_error ?? null),
        }
      : null,
  };
}

function lineFromRow(r: any): QuoteLine {
  return {
    id: r.id,
    lineNo: r.line_no,
    designId: r.design_id,
    designName: r.design_name ?? null,
    line: r.line,
    partId: r.part_id,
    mpn: r.mpn,
    manufacturer: r.manufacturer,
    qtyNeeded: r.qty_needed,
    orderQty: r.order_qty,
    notes: r.notes,
    answer:
      r.unit_price === null
        ? null
        : {
            unitPrice: Number(r.unit_price),
            currency: r.currency,
            moq: r.moq,
            leadTimeDays: r.lead_time_days,
            validUntil: day(r.valid_until)!,
          },
    sourceId: r.source_id,
  };
}
/* eslint-enable @typescript-eslint/no-explicit-any */

const quoteQuery = (db: Db) =>
  db('quote_requests as q')
    .join('supplier_contacts as c', 'c.id', 'q.contact_id')
    .leftJoin('users as u', 'u.id', 'q.created_by')
    .leftJoin('mail_outbox as o', (j) => j.on('o.ref_id', 'q.id').andOn('o.kind', db.raw('?', [QUOTE_MAIL_KIND])))
    .select(quoteColumns(db));

/** Every request, newest first. */
export async function listQuotes(db: Db): Promise<QuoteRequest[]> {
  return (await quoteQuery(db).orderBy('q.id', 'desc')).map(quoteFromRow);
}

export async function countQuotesInState(db: Db, state: QuoteState): Promise<number> {
  const row = await db('quote_requests').where({ state }).count({ n: '*' }).first();
  return Number(row?.n ?? 0);
}

export async function findQuote(db: Db, id: number): Promise<QuoteRequestDetail | null> {
  const row = await quoteQuery(db).where('q.id', id).first();
  if (!row) return null;
  const lines = await db('quote_request_lines as l')
    .leftJoin('designs as d', 'd.id', 'l.design_id')
    .select('l.*', 'd.name as design_name')
    .where('l.quote_request_id', id)
    .orderBy('l.line_no');
  return { ...quoteFromRow(row), lines: lines.map(lineFromRow) };
}

export async function quoteIdByKey(db: Db, idempotencyKey: string): Promise<number | null> {
  const row = await db('quote_requests').where({ idempotency_key: idempotencyKey }).first('id');
  return row ? (row.id as number) : null;
}

/** Locks the request row for the transaction; its state, or null when there is no such request. */
export async function lockQuoteState(trx: Db, id: number): Promise<QuoteState | null> {
  const row = await trx('quote_requests').where({ id }).forUpdate().first('state');
  return row ? (row.state as QuoteState) : null;
}

export interface NewQuoteLine {
  designId: number;
  line: PreferenceLine;
  partId: number;
  mpn: string;
  manufacturer: string;
  qtyNeeded: number;
  orderQty: number;
  notes: string | null;
}

/** Inserts the request (state sent) and its lines numbered 1, 2, …; a repeated idempotency key fails with ER_DUP_ENTRY. */
export async function insertQuote(
  trx: Db,
  q: { contactId: number; idempotencyKey: string; notes: string | null; wantedBy: string | null; createdBy: number; lines: NewQuoteLine[] },
): Promise<number> {
  const [raw] = await trx('quote_requests').insert({
    contact_id: q.contactId,
    state: 'sent',
    idempotency_key: q.idempotencyKey,
    notes: q.notes,
    wanted_by: q.wantedBy,
    created_by: q.createdBy,
  });
  const id = Number(raw);
  await trx('quote_request_lines').insert(
    q.lines.map((l, i) => ({
      quote_request_id: id,
      line_no: i + 1,
      design_id: l.designId,
      line: l.line,
      part_id: l.partId,
      mpn: l.mpn,
      manufacturer: l.manufacturer,
      qty_needed: l.qtyNeeded,
      order_qty: l.orderQty,
      notes: l.notes,
    })),
  );
  return id;
}

/** The part's maker and number; null when there is no such part. */
export async function partName(db: Db, partId: number): Promise<{ mpn: string; manufacturer: string } | null> {
  const row = await db('parts').where({ id: partId }).first('mpn', 'manufacturer');
  return row ? { mpn: row.mpn as string, manufacturer: row.manufacturer as string } : null;
}

/** A new part source made from a quote answer: no stock known, any order multiple, one price break at the MOQ. */
export async function insertQuotedSource(
  trx: Db,
  s: { partId: number; distributor: string; sku: string; answer: QuoteLineAnswer },
): Promise<number> {
  const [raw] = await trx('part_sources').insert({
    part_id: s.partId,
    distributor: s.distributor,
    sku: s.sku,
    moq: s.answer.moq,
    order_multiple: 1,
    lead_time_days: s.answer.leadTimeDays,
    stock_qty: 0,
    currency: s.answer.currency,
  });
  const sourceId = Number(raw);
  await trx('part_price_breaks').insert({ source_id: sourceId, qty: s.answer.moq, unit_price: s.answer.unitPrice });
  return sourceId;
}

export async function setLineAnswer(trx: Db, lineId: number, a: QuoteLineAnswer, sourceId: number): Promise<void> {
  await trx('quote_request_lines').where({ id: lineId }).update({
    unit_price: a.unitPrice,
    currency: a.currency,
    moq: a.moq,
    lead_time_days: a.leadTimeDays,
    valid_until: a.validUntil,
    source_id: sourceId,
  });
}

export async function setQuoteState(trx: Db, id: number, state: 'answered' | 'closed'): Promise<void> {
  await trx('quote_requests')
    .where({ id })
    .update(state === 'answered' ? { state, answered_at: trx.fn.now(3) } : { state, closed_at: trx.fn.now(3) });
}

/** Sources made from quote answers whose offer has run out (valid until before `today`, YYYY-MM-DD), among these parts. */
export async function expiredQuotedSourceIds(db: Db, partIds: readonly number[], today: string): Promise<Set<number>> {
  if (partIds.length === 0) return new Set();
  const rows: { source_id: number }[] = await db('quote_request_lines')
    .whereIn('part_id', [...new Set(partIds)])
    .whereNotNull('source_id')
    .where('valid_until', '<', today)
    .select('source_id');
  return new Set(rows.map((r) => r.source_id));
}
