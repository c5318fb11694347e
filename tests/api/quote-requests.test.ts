/**
 * Requests for quotation (issue 13 item 4): a buyer sends chosen shortlist lines to a supplier contact; the
 * local SMTP sink receives exactly one mail (also on a double click: same idempotency key) with the CSV of
 * the lines attached; the buyer enters the answer and the shortlist offers the quoted source at the quoted
 * price; the request closes; wrong state moves are 409, bad bodies 400 naming the field with nothing written.
 * Expected figures are worked out by hand here. Rules (common practice): need = ceil(1 × 500 × 1.02) = 510;
 * order = need raised to the MOQ, then to whole order multiples; unit price = highest break at or below the
 * order; money to the cent. The fan's switch gets one hand-written source first, so the cheapest before the
 * quote is known: 510 at the 500 break of 0.25 EUR = 127.50 EUR.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';

const knex = appDb();
const api = () => request(appUrl());
let buyer = '';
let designer = '';
let fanId = 0;
const chosen: Record<string, { id: number; mpn: string; manufacturer: string }> = {};
const CONTACT = { name: 'Ada Lind', company: 'Quayside Test Components', email: 'ada.lind@quayside-test.example' };
let contactId = 0;
let quoteId = 0;

beforeAll(async () => {
  [buyer, designer] = await Promise.all([sessionCookie('buyer'), sessionCookie('designer')]);
  fanId = (await knex('designs').where({ name: 'BF-12 bench fan, 12 V, on/off from 3.3 V logic' }).first('id')).id;
  const picks = await knex('design_parts as dp')
    .join('parts as p', 'p.id', 'dp.part_id')
    .where({ 'dp.design_id': fanId, 'dp.position': 0 })
    .select('dp.role', 'p.id', 'p.mpn', 'p.manufacturer');
  for (const p of picks) chosen[p.role] = { id: p.id, mpn: p.mpn, manufacturer: p.manufacturer };
  await knex('part_sources').where({ part_id: chosen.switch.id }).del();
  const [sid] = await knex('part_sources').insert({
    part_id: chosen.switch.id,
    distributor: 'Test Strip Supply',
    sku: 'TSS-1',
    moq: 1,
    order_multiple: 10,
    stock_qty: 200,
    lead_time_days: 5,
    currency: 'EUR',
  });
  await knex('part_price_breaks').insert([
    { source_id: sid, qty: 1, unit_price: 0.4 },
    { source_id: sid, qty: 100, unit_price: 0.3 },
    { source_id: sid, qty: 500, unit_price: 0.25 },
  ]);
});
afterAll(() => knex.destroy());

const counts = async () => {
  const n = async (t: string) => Number((await knex(t).count({ n: '*' }))[0].n);
  return {
    contacts: await n('supplier_contacts'),
    quotes: await n('quote_requests'),
    lines: await n('quote_request_lines'),
    sources: await n('part_sources'),
    mail: await n('captured_mail'),
    audit: await n('audit_events'),
  };
};

const sendBody = (key: string) => ({
  contactId,
  idempotencyKey: key,
  wantedBy: '2027-01-15',
  notes: 'Cut tape is fine.',
  lines: [
    { designId: fanId, line: 'switch', partId: chosen.switch.id, quantityNeeded: 510, orderQuantity: 510 },
    // A note that a spreadsheet would run as a formula: the CSV writer must neutralise it.
    { designId: fanId, line: 'diode', partId: chosen.diode.id, quantityNeeded: 510, orderQuantity: 750, notes: '=SUM(A1:A9)' },
  ],
});

interface ShortQuote {
  orderQty: number;
  breakQty: number | null;
  unitPrice: number | null;
  extendedCost: number | null;
  source: { distributor: string; sku: string; currency: string; moq: number; leadTimeDays: number };
}

async function fanSwitch(): Promise<{ quote: ShortQuote | null; quotes: ShortQuote[] }> {
  const res = await api().get('/api/shortlist').set('Cookie', buyer);
  expect(res.status, res.text.slice(0, 300)).toBe(200);
  const d = res.body.designs.find((x: { id: number }) => x.id === fanId);
  return d.lines.find((l: { key: string }) => l.key === 'switch').options.find((o: { position: number }) => o.position === 0);
}

describe('supplier contacts', () => {
  it('refuses a contact with a bad e-mail, naming the field, and writes nothing', async () => {
    const before = await counts();
    const res = await api()
      .post('/api/suppliers')
      .set('Cookie', buyer)
      .send({ ...CONTACT, email: 'not-an-address' });
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path)).toEqual(['email']);
    expect(await counts()).toEqual(before);
  });

  it('a buyer adds a contact (audited); a designer may not', async () => {
    const res = await api().post('/api/suppliers').set('Cookie', buyer).send(CONTACT);
    expect(res.status, res.text).toBe(201);
    expect(res.body.contact).toMatchObject(CONTACT);
    contactId = res.body.contact.id;
    const audit = await knex('audit_events').where({ entity_type: 'supplier_contact', entity_id: contactId }).select('action');
    expect(audit.map((a) => a.action)).toEqual(['supplier_contact.create']);
    const denied = await api()
      .post('/api/suppliers')
      .set('Cookie', designer)
      .send({ ...CONTACT, email: 'x@quayside-test.example' });
    expect(denied.status).toBe(403);
  });

  it('a second contact with the same e-mail is a 409 naming email', async () => {
    const res = await api().post('/api/suppliers').set('Cookie', buyer).send(CONTACT);
    expect(res.status).toBe(409);
    expect(res.body.issues[0].path).toBe('email');
  });
});

describe('sending a request for quotation', () => {
  it('refuses bad bodies with 400 naming the field, sends no mail and writes nothing', async () => {
    const before = await counts();
    const good = sendBody('bad-bodies-0001');
    const cases: [object, string][] = [
      [{ ...good, contactId: undefined }, 'contactId'],
      [{ ...good, idempotencyKey: 'x' }, 'idempotencyKey'],
      [{ ...good, wantedBy: '2027-02-30' }, 'wantedBy'],
      [{ ...good, lines: [] }, 'lines'],
      [{ ...good, lines: [{ ...good.lines[0], quantityNeeded: 0 }] }, 'lines.0.quantityNeeded'],
      [{ ...good, lines: [good.lines[0], { ...good.lines[1], line: 'fuse' }] }, 'lines.1.line'],
      [{ ...good, lines: [{ ...good.lines[0], orderQuantity: 509 }] }, 'lines.0.orderQuantity'],
    ];
    for (const [body, field] of cases) {
      const res = await api().post('/api/quotes').set('Cookie', buyer).send(body);
      expect([field, res.status], res.text).toEqual([field, 400]);
      expect(res.body.issues.map((i: { path: string }) => i.path)).toContain(field);
    }
    expect(await counts()).toEqual(before);
  });

  it('a part that is not on that line of the design is a 409 naming it, nothing sent', async () => {
    const before = await counts();
    const body = sendBody('wrong-part-0001');
    body.lines[0] = { ...body.lines[0], partId: chosen.diode.id };
    const res = await api().post('/api/quotes').set('Cookie', buyer).send(body);
    expect(res.status).toBe(409);
    expect(res.body.issues[0].path).toBe('lines.0.partId');
    expect(await counts()).toEqual(before);
  });

  it('a double click (two sends with one key at once) makes one request and one mail, with the CSV attached', async () => {
    const mailBefore = Number((await knex('captured_mail').max({ m: 'id' }))[0].m ?? 0);
    const [a, b] = await Promise.all([
      api().post('/api/quotes').set('Cookie', buyer).send(sendBody('double-click-0001')),
      api().post('/api/quotes').set('Cookie', buyer).send(sendBody('double-click-0001')),
    ]);
    expect([a.status, b.status].sort(), a.text + b.text).toEqual([200, 201]);
    expect(a.body.quote.id).toBe(b.body.quote.id);
    quoteId = a.body.quote.id;
    expect(a.body.quote.state).toBe('sent');
    // A third send with the same key later: still the same request, nothing new.
    const again = await api().post('/api/quotes').set('Cookie', buyer).send(sendBody('double-click-0001'));
    expect([again.status, again.body.repeated, again.body.quote.id]).toEqual([200, true, quoteId]);

    const mails = await knex('captured_mail').where('id', '>', mailBefore).andWhere('envelope_to', 'like', `%${CONTACT.email}%`);
    expect(mails).toHaveLength(1);
    expect(mails[0].subject).toBe(`Request for quotation Q-${quoteId}`);
    const attachments = JSON.parse(mails[0].attachments_json) as { filename: string; contentType: string; text: string }[];
    expect(attachments.map((x) => x.filename)).toEqual([`quote-request-Q-${quoteId}.csv`]);
    expect(attachments[0].contentType).toMatch(/^text\/csv/);
    // Hand-written: header, one row per line in the order sent, CRLF ends (RFC 4180), the formula-like
    // note with one leading apostrophe (OWASP "CSV injection" advice).
    const s = chosen.switch;
    const d = chosen.diode;
    expect(attachments[0].text).toBe(
      'Line,Part number,Maker,Quantity needed,Order quantity,Wanted by,Notes\r\n' +
        `1,${s.mpn},${s.manufacturer},510,510,2027-01-15,\r\n` +
        `2,${d.mpn},${d.manufacturer},510,750,2027-01-15,'=SUM(A1:A9)\r\n`,
    );
    const audit = await knex('audit_events').where({ entity_type: 'quote_request', entity_id: quoteId }).select('action');
    expect(audit.map((x) => x.action)).toEqual(['quote_request.send']);
    // Admins see the attachment on the mail-sink page.
    const sinkPage = await api()
      .get('/mail')
      .set('Cookie', await sessionCookie('admin'));
    expect(sinkPage.text).toContain(`Attachment quote-request-Q-${quoteId}.csv`);
  });

  it('lists the request as sent, with its two lines', async () => {
    const list = await api().get('/api/quotes').set('Cookie', buyer);
    expect(list.status).toBe(200);
    expect(list.body.quotes.find((q: { id: number }) => q.id === quoteId)).toMatchObject({ state: 'sent', lineCount: 2 });
    const page = await api().get(`/quotes/${quoteId}`).set('Cookie', buyer);
    expect(page.status).toBe(200);
    expect(page.text).toContain('Sent, awaiting the answer');
  });

  it("the buyer's home page counts the one request awaiting an answer; a designer's home has no such card", async () => {
    // This file's database starts from the seeded snapshot, which holds no quote request: one was sent above.
    const home = await api().get('/').set('Cookie', buyer);
    expect(home.status).toBe(200);
    expect(home.text).toContain('Quotes awaiting answers');
    expect(home.text).toContain('1 request was sent and not answered yet.');
    const designerHome = await api().get('/').set('Cookie', designer);
    expect(designerHome.text).not.toContain('Quotes awaiting answers');
  });
});

describe('answering and closing', () => {
  it('before the answer, the shortlist buys the switch from the strip source at 127.50 EUR', async () => {
    const o = await fanSwitch();
    // 510 → 51 strips of 10 = 510, break 500 at 0.25 → 127.50 EUR.
    expect([o.quote?.source.sku, o.quote?.orderQty, o.quote?.unitPrice, o.quote?.extendedCost]).toEqual(['TSS-1', 510, 0.25, 127.5]);
  });

  it('refuses a bad answer body with 400 naming the field, nothing written', async () => {
    const q = (await api().get(`/api/quotes/${quoteId}`).set('Cookie', buyer)).body.quote;
    const before = await counts();
    const good = { lineId: q.lines[0].id, unitPrice: 0.21, currency: 'EUR', moq: 500, leadTimeDays: 20, validUntil: '2027-02-01' };
    const cases: [object, string][] = [
      [{ lines: [{ ...good, currency: 'EU' }] }, 'lines.0.currency'],
      [{ lines: [{ ...good, unitPrice: -1 }] }, 'lines.0.unitPrice'],
      [{ lines: [{ ...good, validUntil: 'soon' }] }, 'lines.0.validUntil'],
      [{ lines: [good, { ...good, lineId: 99999999 }] }, 'lines.1.lineId'],
      [{ lines: [good, good] }, 'lines.1.lineId'],
    ];
    for (const [body, field] of cases) {
      const res = await api().post(`/api/quotes/${quoteId}/answer`).set('Cookie', buyer).send(body);
      expect([field, res.status], res.text).toEqual([field, 400]);
      expect(res.body.issues.map((i: { path: string }) => i.path)).toContain(field);
    }
    expect(await counts()).toEqual(before);
  });

  it('the answer makes the quoted price a source: the shortlist now buys the switch at 0.21 EUR, 107.10 EUR', async () => {
    const q = (await api().get(`/api/quotes/${quoteId}`).set('Cookie', buyer)).body.quote;
    const res = await api()
      .post(`/api/quotes/${quoteId}/answer`)
      .set('Cookie', buyer)
      .send({ lines: [{ lineId: q.lines[0].id, unitPrice: 0.21, currency: 'eur', moq: 500, leadTimeDays: 20, validUntil: '2027-02-01' }] });
    expect(res.status, res.text).toBe(200);
    expect(res.body.quote.state).toBe('answered');
    expect(res.body.quote.lines[0].answer).toEqual({
      unitPrice: 0.21,
      currency: 'EUR',
      moq: 500,
      leadTimeDays: 20,
      validUntil: '2027-02-01',
    });
    expect(res.body.quote.lines[1].answer).toBeNull();

    const o = await fanSwitch();
    // Quoted source: MOQ 500 ≤ 510, multiple 1 → order 510; one break at 500 of 0.21 → 510 × 0.21 = 107.10 EUR,
    // below 127.50 EUR, so it is the cheapest and the one chosen.
    expect(o.quote).toMatchObject({
      orderQty: 510,
      breakQty: 500,
      unitPrice: 0.21,
      extendedCost: 107.1,
      source: { distributor: CONTACT.company, sku: `Q${quoteId}-1`, currency: 'EUR', moq: 500, leadTimeDays: 20 },
    });
    expect(o.quotes.map((x) => x.source.sku).sort()).toEqual([`Q${quoteId}-1`, 'TSS-1'].sort());
  });

  it('a second answer is a 409 naming the state; nothing changes', async () => {
    const before = await counts();
    const q = (await api().get(`/api/quotes/${quoteId}`).set('Cookie', buyer)).body.quote;
    const res = await api()
      .post(`/api/quotes/${quoteId}/answer`)
      .set('Cookie', buyer)
      .send({ lines: [{ lineId: q.lines[1].id, unitPrice: 0.1, currency: 'EUR', moq: 100, leadTimeDays: 5, validUntil: '2027-02-01' }] });
    expect(res.status).toBe(409);
    expect(res.body.issues[0].path).toBe('state');
    expect(await counts()).toEqual(before);
  });

  it('closes; closing or answering again is a 409; the quoted source stays on the shortlist', async () => {
    const res = await api().post(`/api/quotes/${quoteId}/close`).set('Cookie', buyer).send({});
    expect(res.status, res.text).toBe(200);
    expect(res.body.quote.state).toBe('closed');
    const again = await api().post(`/api/quotes/${quoteId}/close`).set('Cookie', buyer).send({});
    expect(again.status).toBe(409);
    const answer = await api()
      .post(`/api/quotes/${quoteId}/answer`)
      .set('Cookie', buyer)
      .send({
        lines: [
          { lineId: res.body.quote.lines[1].id, unitPrice: 0.1, currency: 'EUR', moq: 100, leadTimeDays: 5, validUntil: '2027-02-01' },
        ],
      });
    expect(answer.status).toBe(409);
    expect((await fanSwitch()).quote?.source.sku).toBe(`Q${quoteId}-1`);
    const audit = await knex('audit_events').where({ entity_type: 'quote_request', entity_id: quoteId }).orderBy('id').select('action');
    expect(audit.map((x) => x.action)).toEqual(['quote_request.send', 'quote_request.answer', 'quote_request.close']);
    const page = await api().get('/quotes').set('Cookie', buyer);
    expect(page.text).toContain('Closed');
  });

  it('an answer whose offer has run out (valid until 2020-01-01) is not offered on the shortlist', async () => {
    const body = sendBody('expired-offer-0001');
    const sent = await api()
      .post('/api/quotes')
      .set('Cookie', buyer)
      .send({ ...body, lines: [body.lines[0]] });
    expect(sent.status, sent.text).toBe(201);
    const second = sent.body.quote;
    const res = await api()
      .post(`/api/quotes/${second.id}/answer`)
      .set('Cookie', buyer)
      .send({
        lines: [{ lineId: second.lines[0].id, unitPrice: 0.1, currency: 'EUR', moq: 1, leadTimeDays: 3, validUntil: '2020-01-01' }],
      });
    expect(res.status, res.text).toBe(200);
    const o = await fanSwitch();
    // 510 × 0.10 = 51.00 EUR would be the cheapest, but the offer ran out: still the first quote at 107.10 EUR.
    expect(o.quotes.map((x) => x.source.sku).sort()).toEqual([`Q${quoteId}-1`, 'TSS-1'].sort());
    expect([o.quote?.source.sku, o.quote?.extendedCost]).toEqual([`Q${quoteId}-1`, 107.1]);
  });

  it('an unknown request is a 404', async () => {
    const res = await api().post('/api/quotes/99999999/close').set('Cookie', buyer).send({});
    expect(res.status).toBe(404);
  });
});
