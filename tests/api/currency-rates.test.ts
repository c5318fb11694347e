/**
 * The rates table an admin keeps (issue 13 item 1). Expected rows are written out by hand from the demo
 * seed's invented EUR values (db/seeds/demo.ts: 1 USD = 0.915 EUR, 1 GBP = 1.172 EUR, set 2026-12-01) with
 * the default organisation currency EUR (README "Configuration"); refusals from the field rules of the form.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { demoAddress, sessionCookie } from '../helpers/session.ts';

const knex = appDb();
const api = () => request(appUrl());
let admin = '';
let buyer = '';
beforeAll(async () => {
  admin = await sessionCookie('admin');
  buyer = await sessionCookie('buyer');
});
afterAll(() => knex.destroy());

const put = (cookie: string, body: unknown) =>
  api()
    .put('/api/rates')
    .set('Cookie', cookie)
    .set('Origin', appUrl())
    .send(body as object);

describe('exchange rates', () => {
  it('lists the seeded rates into EUR for anyone signed in', async () => {
    const res = await api().get('/api/rates').set('Cookie', buyer);
    expect(res.status).toBe(200);
    expect(res.body.orgCurrency).toBe('EUR');
    expect(
      res.body.rates.map((r: { currency: string; rateToOrg: number; asOf: string; setByName: string | null }) => [
        r.currency,
        r.rateToOrg,
        r.asOf,
        r.setByName,
      ]),
    ).toEqual([
      ['GBP', 1.172, '2026-12-01', null],
      ['USD', 0.915, '2026-12-01', null],
    ]);
  });

  it('lets an admin replace a rate, records who set it and writes an audit event with before and after', async () => {
    const res = await put(admin, { currency: 'usd', rateToOrg: 0.9321, asOf: '2026-12-02' });
    expect(res.status).toBe(200);
    expect(res.body.rate).toMatchObject({ currency: 'USD', rateToOrg: 0.9321, asOf: '2026-12-02', setByName: 'Ada Brennan' });
    const row = await knex('currency_rates').where({ currency: 'USD' }).first();
    const adminId = (
      await knex('users')
        .where({ email: demoAddress('admin') })
        .first('id')
    ).id;
    expect([Number(row.rate_to_org), row.set_by]).toEqual([0.9321, adminId]);
    const audit = await knex('audit_events').where({ entity_type: 'currency_rate', entity_id: row.id }).orderBy('id', 'desc').first();
    expect(audit.action).toBe('currency_rate.set');
    expect(JSON.parse(audit.before_json)).toEqual({ currency: 'USD', rateToOrg: 0.915, asOf: '2026-12-01' });
    expect(JSON.parse(audit.after_json)).toEqual({ currency: 'USD', rateToOrg: 0.9321, asOf: '2026-12-02', orgCurrency: 'EUR' });
  });

  it('adds a currency that had no rate', async () => {
    const res = await put(admin, { currency: 'CHF', rateToOrg: 1.05, asOf: '2026-12-03' });
    expect(res.status).toBe(200);
    expect((await knex('currency_rates').where({ currency: 'CHF' }).first()).as_of).toBeTruthy();
  });

  it.each([
    [{ currency: 'EURO', rateToOrg: 1, asOf: '2026-12-01' }, 'currency'],
    [{ currency: 'USD', rateToOrg: 0, asOf: '2026-12-01' }, 'rateToOrg'],
    [{ currency: 'USD', rateToOrg: -0.9, asOf: '2026-12-01' }, 'rateToOrg'],
    [{ currency: 'USD', rateToOrg: '0.9', asOf: '2026-12-01' }, 'rateToOrg'],
    [{ currency: 'USD', rateToOrg: 0.9, asOf: '2026-02-30' }, 'asOf'],
    [{ currency: 'USD', rateToOrg: 0.9 }, 'asOf'],
    [{ currency: 'EUR', rateToOrg: 1, asOf: '2026-12-01' }, 'currency'], // the organisation's own currency needs no rate
  ])('refuses %j with a 400 naming %s, writing nothing', async (body, field) => {
    const before = await knex('currency_rates').orderBy('currency').select('currency', 'rate_to_org', 'as_of');
    const res = await put(admin, body);
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path)).toContain(field);
    expect(await knex('currency_rates').orderBy('currency').select('currency', 'rate_to_org', 'as_of')).toEqual(before);
  });

  it('refuses a buyer (only admins keep rates)', async () => {
    expect((await put(buyer, { currency: 'USD', rateToOrg: 2, asOf: '2026-12-01' })).status).toBe(403);
  });
});
