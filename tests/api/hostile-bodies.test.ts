/**
 * Generated hostile bodies (fast-check) to every JSON write endpoint: at least 500 per endpoint, half of
 * them a valid body with one field replaced by an extreme value (5e-324, 1e308, 2^32, long or
 * control-character text, wrong types), half arbitrary JSON. Never a 5xx; and whenever the answer is a 4xx,
 * the main tables are exactly as they were (row counts and version sums compared after every request).
 * Sessions belong to a role that may write, so the bodies reach validation rather than stopping at 403.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import fc from 'fast-check';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';
import { MOTOR_BODY, PULL_BODY, SWITCH_BODY } from '../helpers/contract-examples.ts';
import { createPerson, uniqueEmail } from './auth-helpers.ts';

const knex = appDb();
const RUNS = 500;
const cookies: Record<string, string> = {};
let partId = 0;
let partBody: Record<string, unknown> = {};
let partVersion = 1;
let designId = 0;
let designInput: Record<string, unknown> = {};
let designVersion = 1;
let personId = 0;
let switchPartId = 0;
let fanId = 0;
let contactId = 0;
let quoteId = 0;
let quoteLineId = 0;

/** Counts and version sums of the tables a write touches, in one query. */
async function snapshot(): Promise<string> {
  const [rows] = await knex.raw(`select
    (select concat(count(*), ':', coalesce(sum(version), 0)) from parts) parts,
    (select concat(count(*), ':', coalesce(sum(version), 0)) from designs) designs,
    (select count(*) from design_revisions) revisions,
    (select count(*) from part_sources) sources,
    (select count(*) from part_price_breaks) breaks,
    (select count(*) from datasheets) datasheets,
    (select concat(count(*), ':', coalesce(sum(active), 0)) from users) users,
    (select count(*) from user_roles) roles,
    (select count(*) from audit_events) audit,
    (select count(*) from import_requests) imports,
    (select count(*) from account_tokens) tokens,
    (select count(*) from currency_rates) rates,
    (select count(*) from shortlist_preferences) preferences,
    (select count(*) from supplier_contacts) contacts,
    (select concat(count(*), ':', group_concat(state order by id)) from quote_requests) quotes,
    (select count(*) from quote_request_lines) quote_lines,
    (select count(*) from captured_mail) mail,
    (select count(*) from mail_outbox) outbox,
    (select count(*) from blob_deletions) blob_deletions`);
  return JSON.stringify(rows[0]);
}

const EXTREMES = [5e-324, 1e308, -1e308, 4_294_967_296, -1, 0, 1e-12, 2 ** 53 + 2];
const hostileValue = fc.oneof(
  fc.constantFrom(...EXTREMES),
  fc.double(),
  fc.integer(),
  fc.string({ maxLength: 40 }),
  fc.string({ minLength: 500, maxLength: 5000 }),
  fc.constantFrom('\u202e\u0000<script>', '=HYPERLINK("x")', '', ' ', '1e308', 'NaN', '__proto__'),
  fc.boolean(),
  fc.constant(null),
  fc.array(fc.oneof(fc.integer(), fc.string({ maxLength: 5 })), { maxLength: 5 }),
  fc.dictionary(fc.string({ maxLength: 8 }), fc.oneof(fc.integer(), fc.string({ maxLength: 5 })), { maxKeys: 4 }),
);

type Path = (string | number)[];
function leafPaths(value: unknown, at: Path = []): Path[] {
  if (value === null || typeof value !== 'object') return [at];
  const entries = Array.isArray(value) ? value.map((v, i) => [i, v] as const) : Object.entries(value);
  const below = entries.flatMap(([k, v]) => leafPaths(v, [...at, k]));
  return at.length === 0 ? below : [at, ...below];
}
function replaced(base: unknown, path: Path, value: unknown): unknown {
  if (path.length === 0) return value;
  const copy = structuredClone(base) as Record<string | number, unknown>;
  let node = copy;
  for (const key of path.slice(0, -1)) node = node[key] as Record<string | number, unknown>;
  node[path[path.length - 1]] = value;
  return copy;
}
const bodies = (base: unknown): fc.Arbitrary<unknown> => {
  const paths = leafPaths(base);
  const mutated = paths.length
    ? fc.tuple(fc.nat({ max: paths.length - 1 }), hostileValue).map(([i, v]) => replaced(base, paths[i], v))
    : hostileValue;
  return fc.oneof(mutated, fc.jsonValue({ maxDepth: 3 }));
};

interface Endpoint {
  method: 'post' | 'put';
  path: () => string;
  role: 'anonymous' | 'designer' | 'buyer' | 'librarian' | 'admin';
  base: () => unknown;
}

const ENDPOINTS: Endpoint[] = [
  { method: 'post', path: () => '/api/calc/motor', role: 'anonymous', base: () => MOTOR_BODY },
  { method: 'post', path: () => '/api/calc/pull-resistor', role: 'anonymous', base: () => PULL_BODY },
  { method: 'post', path: () => '/api/calc/switch', role: 'anonymous', base: () => SWITCH_BODY },
  { method: 'post', path: () => '/api/calc/supply', role: 'anonymous', base: () => ({ motor: MOTOR_BODY.motor, supply: { voltageV: 3 } }) },
  {
    method: 'post',
    path: () => '/api/auth/signin',
    role: 'anonymous',
    base: () => ({ email: 'designer@x.example', password: 'not it at all' }),
  },
  { method: 'post', path: () => '/api/auth/reset-request', role: 'anonymous', base: () => ({ email: 'nobody@x.example' }) },
  {
    method: 'post',
    path: () => '/api/auth/reset',
    role: 'anonymous',
    base: () => ({ token: 'a'.repeat(52), password: 'a long passphrase here' }),
  },
  {
    method: 'post',
    path: () => '/api/auth/invite-accept',
    role: 'anonymous',
    base: () => ({ token: 'b'.repeat(52), password: 'a long passphrase here' }),
  },
  {
    method: 'post',
    path: () => '/api/auth/password',
    role: 'buyer',
    base: () => ({ currentPassword: 'wrong one', newPassword: 'a long passphrase here' }),
  },
  { method: 'post', path: () => '/api/designs', role: 'designer', base: () => ({ ...designInput, name: 'Generated' }) },
  { method: 'put', path: () => `/api/designs/${designId}`, role: 'designer', base: () => ({ version: designVersion, input: designInput }) },
  { method: 'post', path: () => `/api/designs/${designId}/match`, role: 'designer', base: () => ({ input: designInput }) },
  { method: 'post', path: () => '/api/designs/match', role: 'designer', base: () => ({ input: designInput }) },
  {
    method: 'post',
    path: () => `/api/designs/${designId}/status`,
    role: 'designer',
    base: () => ({ status: 'draft', version: designVersion }),
  },
  { method: 'post', path: () => '/api/parts', role: 'librarian', base: () => ({ ...partBody, mpn: 'GEN-1' }) },
  { method: 'put', path: () => `/api/parts/${partId}`, role: 'librarian', base: () => ({ ...partBody, version: partVersion }) },
  {
    method: 'post',
    path: () => `/api/parts/${partId}/lifecycle`,
    role: 'librarian',
    base: () => ({ lifecycle: 'nrnd', effectiveDate: '2027-01-31', note: 'Notice 12', version: partVersion }),
  },
  {
    method: 'post',
    path: () => `/api/parts/${partId}/review`,
    role: 'librarian',
    base: () => ({ decision: 'reject', reason: 'no', version: partVersion }),
  },
  {
    method: 'put',
    path: () => `/api/parts/${partId}/sources`,
    role: 'buyer',
    base: () => ({ sources: partBody.sources ?? [], version: partVersion }),
  },
  {
    method: 'post',
    path: () => '/api/people',
    role: 'admin',
    base: () => ({ email: 'new@kestrel-fluidics.example', name: 'N', roles: ['buyer'] }),
  },
  { method: 'put', path: () => `/api/people/${personId}/roles`, role: 'admin', base: () => ({ roles: ['buyer'] }) },
  { method: 'post', path: () => `/api/people/${personId}/invite`, role: 'admin', base: () => ({ x: 1 }) },
  { method: 'post', path: () => `/api/people/${personId}/deactivate`, role: 'admin', base: () => ({ x: 1 }) },
  { method: 'post', path: () => `/api/people/${personId}/reactivate`, role: 'admin', base: () => ({ x: 1 }) },
  { method: 'put', path: () => '/api/rates', role: 'admin', base: () => ({ currency: 'USD', rateToOrg: 0.915, asOf: '2026-12-01' }) },
  {
    method: 'put',
    path: () => `/api/designs/${fanId}/preferences`,
    role: 'buyer',
    base: () => ({ line: 'switch', partId: switchPartId, sourceId: null, note: 'generated' }),
  },
  {
    method: 'post',
    path: () => '/api/suppliers',
    role: 'buyer',
    base: () => ({ name: 'Gen Erated', company: 'Generated Supply', email: 'gen@supply.example' }),
  },
  {
    method: 'put',
    path: () => `/api/suppliers/${contactId}`,
    role: 'buyer',
    base: () => ({ name: 'Gen Erated', company: 'Generated Supply', email: 'gen@supply.example' }),
  },
  {
    method: 'post',
    path: () => '/api/quotes',
    role: 'buyer',
    base: () => ({
      contactId,
      idempotencyKey: 'hostile-bodies-1',
      lines: [{ designId: fanId, line: 'switch', partId: switchPartId, quantityNeeded: 10, orderQuantity: 10 }],
    }),
  },
  {
    method: 'post',
    path: () => `/api/quotes/${quoteId}/answer`,
    role: 'buyer',
    base: () => ({ lines: [{ lineId: quoteLineId, unitPrice: 0.2, currency: 'EUR', moq: 1, leadTimeDays: 10, validUntil: '2027-06-30' }] }),
  },
  // POST /api/quotes/:id/close reads no body (the state move is the whole request): not listed here.
  { method: 'post', path: () => '/api/distributor/refresh', role: 'buyer', base: () => ({}) },
];

beforeAll(async () => {
  for (const role of ['designer', 'buyer', 'librarian', 'admin'] as const) cookies[role] = await sessionCookie(role);
  const part = await knex('parts').where({ category: 'diode' }).first('id');
  partId = part.id;
  const loaded = (await request(appUrl()).get(`/api/parts/${partId}`).set('Cookie', cookies.librarian)).body;
  const { id: _id, version, createdAt: _c, updatedAt: _u, ...rest } = loaded.part ?? loaded;
  partVersion = version;
  partBody = rest;
  const design = await knex('designs').first('id');
  designId = design.id;
  const got = (await request(appUrl()).get(`/api/designs/${designId}`).set('Cookie', cookies.designer)).body;
  designInput = got.input;
  designVersion = got.version;
  personId = await createPerson(knex, { email: uniqueEmail('hostile'), password: 'a long test passphrase', roles: ['buyer'] });
  // The demo's ready fan design and its chosen switch: the design the quote and preference bodies refer to.
  fanId = (await knex('designs').where({ name: 'BF-12 bench fan, 12 V, on/off from 3.3 V logic' }).first('id')).id;
  switchPartId = (await knex('design_parts').where({ design_id: fanId, role: 'switch', position: 0 }).first('part_id')).part_id;
  const contact = await request(appUrl())
    .post('/api/suppliers')
    .set('Cookie', cookies.buyer)
    .set('Origin', appUrl())
    .send({ name: 'Hostile Test', company: 'Hostile Supply', email: 'hostile@supply.example' });
  contactId = contact.body.contact.id;
  const quote = await request(appUrl())
    .post('/api/quotes')
    .set('Cookie', cookies.buyer)
    .set('Origin', appUrl())
    .send({
      contactId,
      idempotencyKey: 'hostile-bodies-setup',
      lines: [{ designId: fanId, line: 'switch', partId: switchPartId, quantityNeeded: 10, orderQuantity: 10 }],
    });
  quoteId = quote.body.quote.id;
  quoteLineId = (await request(appUrl()).get(`/api/quotes/${quoteId}`).set('Cookie', cookies.buyer)).body.quote.lines[0].id;
});
afterAll(() => knex.destroy());

describe.each(ENDPOINTS)('$method $path with generated bodies', (endpoint) => {
  it(`${RUNS} bodies: no 5xx, and nothing written when the answer is 4xx`, async () => {
    let before = await snapshot();
    const seen = new Map<number, number>();
    await fc.assert(
      fc.asyncProperty(bodies(endpoint.base()), async (body) => {
        const send = () => {
          const req = request(appUrl())[endpoint.method](endpoint.path()).set('Content-Type', 'application/json').set('Origin', appUrl());
          if (endpoint.role !== 'anonymous') req.set('Cookie', cookies[endpoint.role]);
          return req.send(JSON.stringify(body) ?? 'null');
        };
        let res = await send();
        // The calculators allow a number of requests per address per minute: wait out the window once, so
        // every generated body reaches validation (the sign-in and link limits last 15 min: their 429 stands).
        if (res.status === 429 && endpoint.path().startsWith('/api/calc/')) {
          await new Promise((resolve) => setTimeout(resolve, Number(res.headers['retry-after']) * 1000 + 100));
          res = await send();
        }
        seen.set(res.status, (seen.get(res.status) ?? 0) + 1);
        expect(res.status, JSON.stringify(body)?.slice(0, 300)).toBeLessThan(500);
        expect(res.headers['content-type']).toMatch(/application\/json/);
        const after = await snapshot();
        if (res.status >= 400) expect(after, `${res.status} ${JSON.stringify(res.body).slice(0, 200)}`).toBe(before);
        before = after;
      }),
      { numRuns: RUNS },
    );
    expect([...seen.values()].reduce((a, b) => a + b, 0)).toBeGreaterThanOrEqual(RUNS);
    // The bodies reached validation (not only 401/403/415): some were refused as bad input by name.
    expect(seen.get(400) ?? 0, JSON.stringify([...seen])).toBeGreaterThan(0);
  }, 400_000);
});
