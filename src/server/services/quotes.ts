/**
 * Requests for quotation. A buyer keeps supplier contacts, sends chosen shortlist lines to one contact by
 * e-mail with a CSV of the lines (src/lib/quote-csv.ts through the one CSV writer), enters the supplier's
 * answer per line, and closes the request. States: sent → answered → closed, or sent → closed; any other
 * move is a 409. Each answered line becomes a source of its part (distributor = the contact's company,
 * SKU Q<request>-<line>), so the shortlist prices it like any other source. Every write leaves an audit
 * event. The send is idempotent on the client's key: a second send with the same key waits on the key's
 * unique index and then returns the first request, so a double click makes one request and one mail.
 * The mail is never sent inside the transaction: the transaction that records the request as sent also
 * writes the whole mail (text, HTML, CSV) into the outbox (mail_outbox), and only after the commit does
 * this request try to deliver it (src/server/services/outbox.ts). A rolled-back send leaves no outbox row,
 * so no mail; a mail server that does not answer leaves the row pending for the background retries, and
 * the request shows "mail pending" until the mail server has taken it.
 */
import { db } from '../db.ts';
import type { SessionUser } from '../auth/types.ts';
import type { QuoteAnswerInput, QuoteRequestInput, SupplierContactInput } from '../../lib/schemas/quotes.ts';
import { quoteCsv, quoteFileName } from '../../lib/quote-csv.ts';
import { insertAuditEvent } from '../repos/audit.ts';
import { designUsesPart } from '../repos/shortlist-preferences.ts';
import {
  contactIdByEmail,
  findContact,
  findQuote,
  insertContact,
  insertQuote,
  insertQuotedSource,
  listContacts,
  listQuotes,
  lockQuoteState,
  partName,
  QUOTE_MAIL_KIND,
  quoteIdByKey,
  setLineAnswer,
  setQuoteState,
  updateContact,
  type NewQuoteLine,
  type QuoteRequestDetail,
  type QuoteState,
  type SupplierContact,
} from '../repos/quotes.ts';
import type { MailMessage } from '../mail/messages.ts';
import { insertOutboxMail } from '../repos/mail-outbox.ts';
import { deliverPendingMail } from './outbox.ts';
import { notFound, ServiceError } from './errors.ts';

export type { QuoteRequest, QuoteRequestDetail, SupplierContact, QuoteState } from '../repos/quotes.ts';

const isDuplicate = (err: unknown): boolean => (err as { code?: string }).code === 'ER_DUP_ENTRY';

const emailTaken = (email: string) =>
  new ServiceError(409, `A supplier contact with the e-mail ${email} already exists.`, [
    { path: 'email', message: 'already used by another contact' },
  ]);

export async function supplierContacts(): Promise<SupplierContact[]> {
  return listContacts(db());
}

export async function addSupplierContact(actor: SessionUser, input: SupplierContactInput): Promise<{ contact: SupplierContact }> {
  let id = 0;
  try {
    await db().transaction(async (trx) => {
      id = await insertContact(trx, { ...input, createdBy: actor.id });
      await insertAuditEvent(trx, {
        actorUserId: actor.id,
        action: 'supplier_contact.create',
        entityType: 'supplier_contact',
        entityId: id,
        before: null,
        after: input,
      });
    });
  } catch (err) {
    if (isDuplicate(err)) throw emailTaken(input.email);
    throw err;
  }
  return { contact: (await findContact(db(), id))! };
}

export async function changeSupplierContact(
  actor: SessionUser,
  id: number,
  input: SupplierContactInput,
): Promise<{ contact: SupplierContact }> {
  try {
    await db().transaction(async (trx) => {
      const before = await findContact(trx, id, true);
      if (!before) throw notFound('The supplier contact');
      const other = await contactIdByEmail(trx, input.email);
      if (other !== null && other !== id) throw emailTaken(input.email);
      await updateContact(trx, id, input);
      await insertAuditEvent(trx, {
        actorUserId: actor.id,
        action: 'supplier_contact.update',
        entityType: 'supplier_contact',
        entityId: id,
        before: { name: before.name, company: before.company, email: before.email },
        after: input,
      });
    });
  } catch (err) {
    if (isDuplicate(err)) throw emailTaken(input.email);
    throw err;
  }
  return { contact: (await findContact(db(), id))! };
}

export async function quoteRequests() {
  return listQuotes(db());
}

export async function quoteRequest(id: number): Promise<QuoteRequestDetail> {
  const q = await findQuote(db(), id);
  if (!q) throw notFound('The quote request');
  return q;
}

export async function quoteRequestOrNull(id: number): Promise<QuoteRequestDetail | null> {
  return findQuote(db(), id);
}

function requestMessage(
  id: number,
  contact: SupplierContact,
  sender: SessionUser,
  input: QuoteRequestInput,
  lines: NewQuoteLine[],
): MailMessage {
  const intro = [
    `Hello ${contact.name},`,
    `please quote the parts in the attached list (${quoteFileName(id)}): unit price and currency, minimum order quantity, lead time and how long the offer holds.`,
    ...(input.wantedBy ? [`We want the parts by ${input.wantedBy}.`] : []),
    ...(input.notes ? [input.notes] : []),
  ];
  const list = lines.map((l, i) => `${i + 1}. ${l.manufacturer} ${l.mpn}: ${l.orderQty} pcs (need ${l.qtyNeeded})`);
  const outro = [`Please answer to ${sender.email} and quote the reference Q-${id}.`, `${sender.name}`];
  const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
  return {
    subject: `Request for quotation Q-${id}`,
    text: [...intro, '', ...list, '', ...outro].join('\n'),
    html: `<!doctype html>\n<html lang="en"><body style="font-family: sans-serif">${intro.map((p) => `<p>${esc(p)}</p>`).join('')}<ol>${lines
      .map((l) => `<li>${esc(`${l.manufacturer} ${l.mpn}: ${l.orderQty} pcs (need ${l.qtyNeeded})`)}</li>`)
      .join('')}</ol>${outro.map((p) => `<p>${esc(p)}</p>`).join('')}</body></html>`,
    attachments: [
      {
        filename: quoteFileName(id),
        contentType: 'text/csv; charset=utf-8',
        content: quoteCsv(
          lines.map((l, i) => ({ lineNo: i + 1, ...l })),
          input.wantedBy,
        ),
      },
    ],
  };
}

/** Sends the request; `repeated` when the idempotency key was used before (then nothing is sent again). */
export async function sendQuoteRequest(
  actor: SessionUser,
  input: QuoteRequestInput,
): Promise<{ quote: QuoteRequestDetail; repeated: boolean }> {
  const earlier = await quoteIdByKey(db(), input.idempotencyKey);
  if (earlier !== null) return { quote: await quoteRequest(earlier), repeated: true };
  let id = 0;
  let outboxId = 0;
  try {
    await db().transaction(async (trx) => {
      const contact = await findContact(trx, input.contactId);
      if (!contact)
        throw new ServiceError(404, 'The supplier contact was not found.', [{ path: 'contactId', message: 'no such supplier contact' }]);
      const lines: NewQuoteLine[] = [];
      for (const [i, l] of input.lines.entries()) {
        const part = await partName(trx, l.partId);
        if (!part || !(await designUsesPart(trx, l.designId, l.line, l.partId)))
          throw new ServiceError(409, `Line ${i + 1}: part ${l.partId} is not an option of the ${l.line} line of design ${l.designId}.`, [
            { path: `lines.${i}.partId`, message: `not the chosen part or an alternate of the ${l.line} line of that design` },
          ]);
        if (l.orderQuantity < l.quantityNeeded)
          throw new ServiceError(400, `Line ${i + 1}: the order quantity is below the quantity needed.`, [
            { path: `lines.${i}.orderQuantity`, message: 'at least the quantity needed' },
          ]);
        lines.push({ ...l, ...part, qtyNeeded: l.quantityNeeded, orderQty: l.orderQuantity });
      }
      id = await insertQuote(trx, {
        contactId: contact.id,
        idempotencyKey: input.idempotencyKey,
        notes: input.notes,
        wantedBy: input.wantedBy,
        createdBy: actor.id,
        lines,
      });
      await insertAuditEvent(trx, {
        actorUserId: actor.id,
        action: 'quote_request.send',
        entityType: 'quote_request',
        entityId: id,
        before: null,
        after: { state: 'sent', contactId: contact.id, to: contact.email, wantedBy: input.wantedBy, notes: input.notes, lines },
      });
      // Last write of the transaction: the mail itself, delivered only once all of this has committed.
      outboxId = await insertOutboxMail(trx, {
        idempotencyKey: `${QUOTE_MAIL_KIND}:${input.idempotencyKey}`,
        kind: QUOTE_MAIL_KIND,
        refId: id,
        to: contact.email,
        message: requestMessage(id, contact, actor, input, lines),
      });
    });
  } catch (err) {
    if (isDuplicate(err)) {
      const first = await quoteIdByKey(db(), input.idempotencyKey);
      if (first !== null) return { quote: await quoteRequest(first), repeated: true };
    }
    throw err;
  }
  await deliverSoon(outboxId);
  return { quote: await quoteRequest(id), repeated: false };
}

/** How long a send waits for its own mail before it answers "mail pending" (the try goes on in the background). */
export const SEND_WAIT_MS = 3_000;

/** One delivery try of the mail just committed, waited for up to SEND_WAIT_MS; failures stay in the outbox. */
async function deliverSoon(outboxId: number): Promise<void> {
  const attempt = deliverPendingMail({ onlyId: outboxId }).catch((err: unknown) =>
    console.error(`[stallpoint] delivering quote mail ${outboxId} failed: ${err instanceof Error ? err.message : String(err)}`),
  );
  let timer: NodeJS.Timeout | undefined;
  await Promise.race([attempt, new Promise<void>((resolve) => (timer = setTimeout(resolve, SEND_WAIT_MS).unref()))]);
  clearTimeout(timer);
}

const wrongState = (id: number, state: QuoteState, wanted: string) =>
  new ServiceError(409, `Quote request Q-${id} is ${state}: it cannot be ${wanted}.`, [{ path: 'state', message: `is ${state}` }]);

/** Enters the supplier's answer (state sent → answered); each answered line becomes a source of its part. */
export async function answerQuoteRequest(actor: SessionUser, id: number, input: QuoteAnswerInput): Promise<{ quote: QuoteRequestDetail }> {
  await db().transaction(async (trx) => {
    const state = await lockQuoteState(trx, id);
    if (state === null) throw notFound('The quote request');
    if (state !== 'sent') throw wrongState(id, state, 'answered');
    const quote = (await findQuote(trx, id))!;
    const seen = new Set<number>();
    const answered = [];
    for (const [i, a] of input.lines.entries()) {
      const line = quote.lines.find((l) => l.id === a.lineId);
      if (!line || seen.has(a.lineId))
        throw new ServiceError(400, `Answer ${i + 1}: line ${a.lineId} is ${line ? 'answered twice' : 'not a line of this request'}.`, [
          { path: `lines.${i}.lineId`, message: line ? 'answered twice' : 'not a line of this request' },
        ]);
      seen.add(a.lineId);
      const answer = { unitPrice: a.unitPrice, currency: a.currency, moq: a.moq, leadTimeDays: a.leadTimeDays, validUntil: a.validUntil };
      const sourceId = await insertQuotedSource(trx, {
        partId: line.partId,
        distributor: quote.contact.company,
        sku: `Q${id}-${line.lineNo}`,
        answer,
      });
      await setLineAnswer(trx, line.id, answer, sourceId);
      answered.push({ lineNo: line.lineNo, partId: line.partId, sourceId, ...answer });
    }
    await setQuoteState(trx, id, 'answered');
    await insertAuditEvent(trx, {
      actorUserId: actor.id,
      action: 'quote_request.answer',
      entityType: 'quote_request',
      entityId: id,
      before: { state },
      after: { state: 'answered', lines: answered },
    });
  });
  return { quote: await quoteRequest(id) };
}

/** Closes the request (sent or answered → closed); quoted sources stay on their parts. */
export async function closeQuoteRequest(actor: SessionUser, id: number): Promise<{ quote: QuoteRequestDetail }> {
  await db().transaction(async (trx) => {
    const state = await lockQuoteState(trx, id);
    if (state === null) throw notFound('The quote request');
    if (state === 'closed') throw wrongState(id, state, 'closed again');
    await setQuoteState(trx, id, 'closed');
    await insertAuditEvent(trx, {
      actorUserId: actor.id,
      action: 'quote_request.close',
      entityType: 'quote_request',
      entityId: id,
      before: { state },
      after: { state: 'closed' },
    });
  });
  return { quote: await quoteRequest(id) };
}
