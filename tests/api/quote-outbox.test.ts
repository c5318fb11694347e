/**
 * The request for quotation's mail goes through the outbox (mail_outbox): it is written in the transaction
 * that records the request as sent and delivered only after the commit. Checked here against real failure
 * paths, no stubbed mailer:
 * - the send's transaction fails at its last write (the outbox insert waits on a lock this file holds, until
 *   the app's statement deadline) → no request, no outbox row, and no mail ever reaches the sink;
 * - the SMTP server is down (this file's own sink, stopped) → the request is recorded, its mail stays
 *   pending with the error and a later try (backoff), and once the sink is back one run delivers it once;
 * - two runners (two pools, as two app servers) working the same pending rows at once deliver each once.
 * Counts come from the sink's own table (captured_mail), read beside the app.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { demoAddress, sessionCookie } from '../helpers/session.ts';
import { startMailSink, type Services } from '../../scripts/stack/services.ts';
import { freePort } from '../../scripts/stack/throwaway.ts';
import { readConfig, resetAppConfig } from '../../src/server/config.ts';
import { deliverPendingMail, retryDelayMs } from '../../src/server/services/outbox.ts';
import { sendQuoteRequest } from '../../src/server/services/quotes.ts';
import { insertOutboxMail } from '../../src/server/repos/mail-outbox.ts';

const knex = appDb();
const api = () => request(appUrl());
let buyer = '';
let fanId = 0;
let switchId = 0;
let contactId = 0;
let sinkPort = 0;
let sink: Services | null = null;
const CONTACT = { name: 'Oona Pell', company: 'Harbourline Test Parts', email: 'oona.pell@harbourline-test.example' };

const mailConfig = () => readConfig({ ...process.env, SMTP_HOST: '127.0.0.1', SMTP_PORT: String(sinkPort), MAIL_SINK: 'local' }).mail;
const outboxConfig = { intervalS: 0, retryBaseS: 30, mailAttempts: 3 };
const startSink = async () => {
  sink = await startMailSink({ ...process.env, SMTP_SINK_PORT: String(sinkPort) });
};
const stopSink = async () => {
  await sink?.close();
  sink = null;
};
const mailsTo = async (subject: string) => knex('captured_mail').where({ subject }).andWhere('envelope_to', 'like', `%${CONTACT.email}%`);

const body = (key: string) => ({
  contactId,
  idempotencyKey: key,
  wantedBy: null,
  notes: null,
  lines: [{ designId: fanId, line: 'switch' as const, partId: switchId, quantityNeeded: 510, orderQuantity: 510, notes: null }],
});

beforeAll(async () => {
  buyer = await sessionCookie('buyer');
  fanId = (await knex('designs').where({ name: 'BF-12 bench fan, 12 V, on/off from 3.3 V logic' }).first('id')).id;
  switchId = (await knex('design_parts').where({ design_id: fanId, position: 0, role: 'switch' }).first('part_id')).part_id;
  const res = await api().post('/api/suppliers').set('Cookie', buyer).send(CONTACT);
  expect(res.status, res.text).toBe(201);
  contactId = res.body.contact.id;
  sinkPort = await freePort();
});
afterAll(async () => {
  await stopSink();
  await knex.destroy();
  const shutdown = (globalThis as Record<symbol, unknown>)[Symbol.for('stallpoint.shutdown')];
  if (typeof shutdown === 'function') await (shutdown as () => Promise<void>)();
});

describe('quote mail through the outbox', () => {
  it('a send whose transaction fails at its last write (after the request is built) records nothing and mails nothing', async () => {
    const key = 'commit-fails-0001';
    const mailBefore = Number((await knex('captured_mail').count({ n: '*' }))[0].n);
    const trx = await knex.transaction();
    // A locking read over the whole (empty) outbox holds its end gap: the send's outbox insert, its last
    // statement, waits on it until the app's statement deadline (DB_QUERY_TIMEOUT_MS) and the send fails.
    await trx.raw('select id from mail_outbox where id >= 0 for update');
    let res: request.Response;
    try {
      res = await api().post('/api/quotes').set('Cookie', buyer).send(body(key));
    } finally {
      await trx.rollback();
    }
    expect(res.status, res.text).toBe(503);
    expect(await knex('quote_requests').where({ idempotency_key: key }).first()).toBeUndefined();
    expect(await knex('mail_outbox').where('idempotency_key', 'like', `%${key}`).first()).toBeUndefined();
    // Nothing left to deliver; the sink (the suite's own, up all along) got nothing.
    await startSink();
    expect(await deliverPendingMail({ db: knex, mail: mailConfig(), outbox: outboxConfig })).toEqual({ delivered: 0, failed: 0 });
    await stopSink();
    expect(Number((await knex('captured_mail').count({ n: '*' }))[0].n)).toBe(mailBefore);
  });

  it('with the SMTP server down the request is recorded and its mail pending; once it is back, one run delivers it once', async () => {
    // The service runs here, with this process's SMTP settings pointing at this file's sink, which is down.
    const savedPort = process.env.SMTP_PORT;
    process.env.SMTP_PORT = String(sinkPort);
    resetAppConfig();
    const actor = await knex('users')
      .where({ email: demoAddress('buyer') })
      .first('id', 'email', 'name');
    let quoteId = 0;
    try {
      const sent = await sendQuoteRequest({ ...actor, roles: ['buyer'] }, body('sink-down-0001'));
      quoteId = sent.quote.id;
      expect([sent.repeated, sent.quote.state, sent.quote.mail?.state, sent.quote.mail?.attempts]).toEqual([false, 'sent', 'pending', 1]);
    } finally {
      process.env.SMTP_PORT = savedPort;
      resetAppConfig();
    }
    const subject = `Request for quotation Q-${quoteId}`;
    const row = await knex('mail_outbox').where({ kind: 'quote_request', ref_id: quoteId }).first();
    expect([row.state, row.attempts, row.claimed_by]).toEqual(['pending', 1, null]);
    expect(row.last_error).toMatch(/ECONNREFUSED|connect/i);
    // The retry waits OUTBOX_RETRY_BASE_S (30 s by default) after the first failure.
    expect(new Date(row.next_attempt_at).getTime() - new Date(row.created_at).getTime()).toBeGreaterThanOrEqual(29_000);
    // The buyer is told the mail is pending, not that it went out.
    const page = await api().get(`/quotes/${quoteId}`).set('Cookie', buyer);
    expect(page.text).toContain('Mail pending');

    await startSink();
    // Not due yet: a run now leaves it alone.
    expect(await deliverPendingMail({ db: knex, mail: mailConfig(), outbox: outboxConfig })).toEqual({ delivered: 0, failed: 0 });
    expect(await mailsTo(subject)).toHaveLength(0);
    const later = () => new Date(Date.now() + 31_000);
    expect(await deliverPendingMail({ db: knex, mail: mailConfig(), outbox: outboxConfig, now: later })).toEqual({
      delivered: 1,
      failed: 0,
    });
    const hourLater = () => new Date(Date.now() + 3_600_000);
    expect(await deliverPendingMail({ db: knex, mail: mailConfig(), outbox: outboxConfig, now: hourLater })).toEqual({
      delivered: 0,
      failed: 0,
    });
    await stopSink();
    const mails = await mailsTo(subject);
    expect(mails).toHaveLength(1);
    expect(JSON.parse(mails[0].attachments_json).map((a: { filename: string }) => a.filename)).toEqual([`quote-request-Q-${quoteId}.csv`]);
    const done = await knex('mail_outbox').where({ id: row.id }).first();
    expect([done.state, done.attempts, done.last_error]).toEqual(['delivered', 2, null]);
    const after = await api().get(`/api/quotes/${quoteId}`).set('Cookie', buyer);
    expect(after.body.quote.mail.state).toBe('delivered');
  });

  it('gives up after OUTBOX_MAIL_ATTEMPTS tries and shows the mail as not delivered', async () => {
    const id = await insertOutboxMail(knex, {
      idempotencyKey: 'test:gives-up-0001',
      kind: 'test',
      refId: null,
      to: CONTACT.email,
      message: { subject: 'Outbox test: gives up', text: 'x', html: '<p>x</p>' },
    });
    // Sink down; three tries (mailAttempts 3), each run far enough later to be due.
    for (let i = 1; i <= 3; i++) {
      const at = () => new Date(Date.now() + i * 3_600_000);
      expect(await deliverPendingMail({ db: knex, mail: mailConfig(), outbox: outboxConfig, now: at })).toEqual({
        delivered: 0,
        failed: 1,
      });
    }
    const row = await knex('mail_outbox').where({ id }).first();
    expect([row.state, row.attempts]).toEqual(['failed', 3]);
    // Backoff by hand: 30 s, 60 s, 120 s after the 1st, 2nd, 3rd failure; capped at an hour.
    expect([1, 2, 3, 12].map((n) => retryDelayMs(n, 30))).toEqual([30_000, 60_000, 120_000, 3_600_000]);
  });

  it('two runners working the same pending rows at once deliver each row once; a lapsed claim is taken over, a live one is not', async () => {
    const subjects = Array.from({ length: 8 }, (_, i) => `Outbox test: concurrent ${i + 1}`);
    for (const [i, subject] of subjects.entries())
      await insertOutboxMail(knex, {
        idempotencyKey: `test:concurrent-${i + 1}`,
        kind: 'test',
        refId: null,
        to: CONTACT.email,
        message: { subject, text: subject, html: `<p>${subject}</p>` },
      });
    // One more claimed by a runner that died (claim lapsed), one held by a runner still at work.
    await knex('mail_outbox')
      .where({ idempotency_key: 'test:concurrent-7' })
      .update({ claimed_by: 'dead', claimed_until: new Date(Date.now() - 1000) });
    await knex('mail_outbox')
      .where({ idempotency_key: 'test:concurrent-8' })
      .update({ claimed_by: 'busy', claimed_until: new Date(Date.now() + 600_000) });
    await startSink();
    const [a, b] = [appDb(), appDb()];
    try {
      const runs = await Promise.all([a, b].map((k) => deliverPendingMail({ db: k, mail: mailConfig(), outbox: outboxConfig })));
      expect(runs[0].delivered + runs[1].delivered).toBe(7);
      expect(runs[0].failed + runs[1].failed).toBe(0);
    } finally {
      await Promise.all([a.destroy(), b.destroy()]);
      await stopSink();
    }
    for (const subject of subjects.slice(0, 7)) expect([subject, (await mailsTo(subject)).length]).toEqual([subject, 1]);
    expect(await mailsTo(subjects[7])).toHaveLength(0);
    expect((await knex('mail_outbox').where({ idempotency_key: 'test:concurrent-8' }).first()).state).toBe('pending');
  });
});
