/**
 * Parts CRUD against the real MariaDB: role rules, validation by field, optimistic locking, review,
 * lifecycle, supply data and the audit trail (every change lands there with before and after).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie, demoAddress, type DemoRole } from '../helpers/session.ts';
import { lastMailId, waitForMail } from './auth-helpers.ts';

const knex = appDb();
const cookies = {} as Record<DemoRole, string>;
beforeAll(async () => {
  for (const role of ['admin', 'librarian', 'designer', 'buyer'] as const) cookies[role] = await sessionCookie(role);
});
afterAll(() => knex.destroy());

let serial = 0;
/** A fresh invented diode (Ostler style numbers with a test suffix so reruns never collide). */
function newDiode(overrides: Record<string, unknown> = {}): Record<string, unknown> {
  serial += 1;
  return {
    category: 'diode',
    manufacturer: 'Ostler Rectifier Works',
    mpn: `ORS${10 + serial}-45-MB-T${Date.now().toString(36)}`,
    description: 'Test Schottky diode, 45 V',
    package: 'SMB',
    params: { kind: 'schottky', vrrmV: 45, ifAvA: 2, ifsmA: 50, vfV: 0.55, vfAtIfA: 2, trrNs: null },
    sources: [
      {
        distributor: 'Fenwick Row Electronics',
        sku: `FRE-9${String(serial).padStart(5, '0')}`,
        moq: 1,
        leadTimeDays: 5,
        stockQty: 100,
        currency: 'USD',
        priceBreaks: [
          { qty: 1, unitPrice: 0.3 },
          { qty: 100, unitPrice: 0.12 },
        ],
      },
    ],
    ...overrides,
  };
}

const send = (method: 'post' | 'put', path: string, role: DemoRole | null, body: unknown) => {
  const req = request(appUrl())[method](path).set('Content-Type', 'application/json');
  if (role) req.set('Cookie', cookies[role]);
  return req.send(JSON.stringify(body));
};
const paths = (res: request.Response): string[] => (res.body.issues ?? []).map((i: { path: string }) => i.path);
const events = (id: number) => knex('audit_events').where({ entity_type: 'part', entity_id: id }).orderBy('id');

describe('POST /api/parts', () => {
  it('a librarian adds an approved part; it reads back equal and lands in the audit trail', async () => {
    const body = newDiode();
    const res = await send('post', '/api/parts', 'librarian', body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ mpn: body.mpn, reviewStatus: 'approved', version: 1, params: body.params });
    const got = await request(appUrl()).get(`/api/parts/${res.body.id}`).set('Cookie', cookies.designer);
    expect(got.status).toBe(200);
    expect(got.body).toEqual(res.body);
    const [event] = await events(res.body.id);
    expect(event.action).toBe('part.create');
    expect(JSON.parse(event.after_json).mpn).toBe(body.mpn);
    expect(event.before_json).toBeNull();
  });

  it('a librarian may keep a new part as a draft', async () => {
    const res = await send('post', '/api/parts', 'librarian', newDiode({ reviewStatus: 'draft' }));
    expect(res.body.reviewStatus).toBe('draft');
  });

  it('a designer proposes: the part is pending even when approved is asked for', async () => {
    const res = await send('post', '/api/parts', 'designer', newDiode({ reviewStatus: 'approved' }));
    expect(res.status).toBe(201);
    expect(res.body.reviewStatus).toBe('pending');
    expect((await events(res.body.id))[0].action).toBe('part.propose');
  });

  it('a buyer may not add parts (403) and nobody signed out may (401)', async () => {
    const before = await knex('parts').count({ n: '*' }).first();
    expect((await send('post', '/api/parts', 'buyer', newDiode())).status).toBe(403);
    expect((await send('post', '/api/parts', null, newDiode())).status).toBe(401);
    expect(await knex('parts').count({ n: '*' }).first()).toEqual(before);
  });

  it.each([
    ['a missing parameter', { params: { kind: 'schottky', ifAvA: 2, ifsmA: 50, vfV: 0.55, vfAtIfA: 2 } }, 'params.vrrmV'],
    ['a negative rating', { params: { kind: 'schottky', vrrmV: -45, ifAvA: 2, ifsmA: 50, vfV: 0.55, vfAtIfA: 2 } }, 'params.vrrmV'],
    ['a part number with spaces', { mpn: 'OR S10 45' }, 'mpn'],
    ['an unknown category', { category: 'valve' }, 'category'],
    ['a bad lifecycle date', { lifecycleEffectiveDate: '2026-02-30' }, 'lifecycleEffectiveDate'],
    [
      'two price breaks at one quantity',
      {
        sources: [
          {
            distributor: 'Fenwick Row Electronics',
            sku: 'FRE-100001',
            priceBreaks: [
              { qty: 10, unitPrice: 1 },
              { qty: 10, unitPrice: 0.9 },
            ],
          },
        ],
      },
      'sources.0.priceBreaks.1.qty',
    ],
  ])('refuses %s with 400 naming the field', async (_n, override, field) => {
    const res = await send('post', '/api/parts', 'librarian', newDiode(override));
    expect(res.status).toBe(400);
    expect(paths(res)).toContain(field);
  });

  it('refuses a MOSFET whose VGS(th) min is above its max and a repeated RDS(on) line', async () => {
    const res = await send('post', '/api/parts', 'librarian', {
      category: 'mosfet',
      manufacturer: 'Calderwick Semiconductor',
      mpn: `CWN30L90-S3-T${Date.now().toString(36)}`,
      package: 'SOT-23',
      params: {
        channel: 'n',
        vdsMaxV: 30,
        vgsMaxV: 20,
        vgsThMinV: 2.5,
        vgsThMaxV: 1.5,
        idContinuousA: 3,
        idPulsedA: 12,
        qgTotalNc: 5,
        qgTestVgsV: 4.5,
        rthJaCPerW: 200,
        tjMaxC: 150,
        rdsOn: [
          { vgsV: 4.5, maxOhm: 0.05 },
          { vgsV: 4.5, maxOhm: 0.06 },
        ],
      },
    });
    expect(res.status).toBe(400);
    expect(paths(res)).toEqual(expect.arrayContaining(['params.vgsThMinV', 'params.rdsOn.1.vgsV']));
  });

  it('refuses a body that is not JSON (415) and a duplicate maker and part number (409 at mpn)', async () => {
    const form = await request(appUrl())
      .post('/api/parts')
      .set('Cookie', cookies.librarian)
      .set('Origin', appUrl())
      .type('form')
      .send('mpn=x');
    // A form post from the app's own origin passes Astro's origin check and is refused for its type.
    expect(form.status).toBe(415);
    expect(form.body.issues[0].path).toBe('(headers).content-type');
    const text = await request(appUrl()).post('/api/parts').set('Cookie', cookies.librarian).set('Content-Type', 'text/csv').send('a,b');
    expect(text.status).toBe(415);
    const dup = await send('post', '/api/parts', 'librarian', newDiode({ manufacturer: 'Ostler Rectifier Works', mpn: 'ORS10-40-D123' }));
    expect(dup.status).toBe(409);
    expect(paths(dup)).toContain('mpn');
  });
});

describe('GET /api/parts/:id', () => {
  it('answers 404 for an unknown or malformed id', async () => {
    expect((await request(appUrl()).get('/api/parts/99999999').set('Cookie', cookies.buyer)).status).toBe(404);
    expect((await request(appUrl()).get('/api/parts/abc').set('Cookie', cookies.buyer)).status).toBe(404);
  });
});

describe('PUT /api/parts/:id with optimistic locking', () => {
  it('saves at the loaded version, refuses the stale second save with 409, and leaves the record as the first save made it', async () => {
    const created = (await send('post', '/api/parts', 'librarian', newDiode())).body;
    const first = await send('put', `/api/parts/${created.id}`, 'librarian', { ...created, description: 'first edit', version: 1 });
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    expect(first.body).toMatchObject({ description: 'first edit', version: 2 });
    const stale = await send('put', `/api/parts/${created.id}`, 'admin', {
      ...created,
      description: 'second edit from an old page',
      version: 1,
    });
    expect(stale.status).toBe(409);
    expect(paths(stale)).toContain('version');
    const now = await request(appUrl()).get(`/api/parts/${created.id}`).set('Cookie', cookies.buyer);
    expect(now.body).toMatchObject({ description: 'first edit', version: 2 });
    const edits = (await events(created.id)).filter((e) => e.action === 'part.update');
    expect(edits).toHaveLength(1);
    expect(JSON.parse(edits[0].before_json).description).toBe(created.description);
    expect(JSON.parse(edits[0].after_json).description).toBe('first edit');
  });

  it('needs the version (400), keeps the category (400) and sends lifecycle moves to their own action (400)', async () => {
    const created = (await send('post', '/api/parts', 'librarian', newDiode())).body;
    const { version: _v, ...noVersion } = created;
    expect(paths(await send('put', `/api/parts/${created.id}`, 'librarian', noVersion))).toContain('version');
    const motor = {
      ...created,
      category: 'motor',
      params: { ratedVoltageV: 6, noLoadSpeedRpm: 9000, noLoadCurrentA: 0.1, stallTorqueNm: 0.005, stallCurrentA: 1.5 },
    };
    expect(paths(await send('put', `/api/parts/${created.id}`, 'librarian', motor))).toContain('category');
    expect(paths(await send('put', `/api/parts/${created.id}`, 'librarian', { ...created, lifecycle: 'obsolete' }))).toContain('lifecycle');
  });

  it('a designer may revise their own pending proposal but not an approved part', async () => {
    const mine = (await send('post', '/api/parts', 'designer', newDiode())).body;
    const revised = await send('put', `/api/parts/${mine.id}`, 'designer', { ...mine, package: 'SMA' });
    expect(revised.status).toBe(200);
    expect(revised.body).toMatchObject({ package: 'SMA', reviewStatus: 'pending' });
    const approved = (await send('post', '/api/parts', 'librarian', newDiode())).body;
    expect((await send('put', `/api/parts/${approved.id}`, 'designer', { ...approved, package: 'SMA' })).status).toBe(403);
    expect((await send('put', `/api/parts/${approved.id}`, 'buyer', { ...approved, package: 'SMA' })).status).toBe(403);
  });
});

describe('review', () => {
  it('a librarian rejects a proposal with a reason, the reason is kept and e-mailed to the proposer, and an approval moves a pending part to approved', async () => {
    const proposal = (await send('post', '/api/parts', 'designer', newDiode())).body;
    const noReason = await send('post', `/api/parts/${proposal.id}/review`, 'librarian', { decision: 'reject', version: proposal.version });
    expect(noReason.status).toBe(400);
    expect(paths(noReason)).toContain('reason');
    expect(
      (await send('post', `/api/parts/${proposal.id}/review`, 'designer', { decision: 'approve', version: proposal.version })).status,
    ).toBe(403);
    const mailBefore = await lastMailId(knex);
    const rejected = await send('post', `/api/parts/${proposal.id}/review`, 'librarian', {
      decision: 'reject',
      reason: 'VF does not match page 3 of the datasheet',
      version: proposal.version,
    });
    expect(rejected.status).toBe(200);
    expect(rejected.body.reviewStatus).toBe('rejected');
    const row = await knex('parts').where({ id: proposal.id }).first();
    expect(row.review_note).toBe('VF does not match page 3 of the datasheet');
    const mail = await waitForMail(knex, demoAddress('designer'), mailBefore);
    expect(mail.subject).toContain(proposal.mpn);
    expect(mail.text_body).toContain('VF does not match page 3 of the datasheet');
    expect(mail.text_body).toMatch(new RegExp(`/parts/${proposal.id}\\b`));
    const again = await send('post', `/api/parts/${proposal.id}/review`, 'librarian', {
      decision: 'approve',
      version: rejected.body.version,
    });
    expect(again.status).toBe(409);

    const other = (await send('post', '/api/parts', 'designer', newDiode())).body;
    const approved = await send('post', `/api/parts/${other.id}/review`, 'librarian', { decision: 'approve', version: other.version });
    expect(approved.body.reviewStatus).toBe('approved');
    expect((await events(other.id)).map((e) => e.action)).toEqual(['part.propose', 'part.approve']);
  });
});

describe('lifecycle and supply data', () => {
  it('a librarian moves a part to NRND with date and note; the trail has before and after', async () => {
    const part = (await send('post', '/api/parts', 'librarian', newDiode())).body;
    const bad = await send('post', `/api/parts/${part.id}/lifecycle`, 'librarian', {
      lifecycle: 'nrnd',
      effectiveDate: '31.12.2026',
      note: '',
      version: part.version,
    });
    expect(bad.status).toBe(400);
    expect(paths(bad)).toEqual(expect.arrayContaining(['effectiveDate', 'note']));
    expect(
      (
        await send('post', `/api/parts/${part.id}/lifecycle`, 'designer', {
          lifecycle: 'nrnd',
          effectiveDate: '2026-12-31',
          note: 'notice 12',
          version: part.version,
        })
      ).status,
    ).toBe(403);
    const moved = await send('post', `/api/parts/${part.id}/lifecycle`, 'librarian', {
      lifecycle: 'nrnd',
      effectiveDate: '2026-12-31',
      note: 'Maker notice PCN-0412',
      version: part.version,
    });
    expect(moved.status).toBe(200);
    expect(moved.body).toMatchObject({ lifecycle: 'nrnd', lifecycleEffectiveDate: '2026-12-31', version: part.version + 1 });
    const event = (await events(part.id)).at(-1);
    expect(event).toMatchObject({ action: 'part.lifecycle', note: 'Maker notice PCN-0412' });
    expect(JSON.parse(event.before_json).lifecycle).toBe('active');
    expect(JSON.parse(event.after_json).lifecycle).toBe('nrnd');
  });

  it('a buyer replaces sources and price breaks; a designer may not', async () => {
    const part = (await send('post', '/api/parts', 'librarian', newDiode())).body;
    const sources = [
      {
        distributor: 'Kelderhaus Bauteile',
        sku: 'KB-123-4567',
        moq: 10,
        leadTimeDays: 14,
        stockQty: 2500,
        currency: 'EUR',
        priceBreaks: [
          { qty: 10, unitPrice: 0.2 },
          { qty: 1000, unitPrice: 0.09 },
        ],
      },
    ];
    expect((await send('put', `/api/parts/${part.id}/sources`, 'designer', { sources, version: part.version })).status).toBe(403);
    const res = await send('put', `/api/parts/${part.id}/sources`, 'buyer', { sources, version: part.version });
    expect(res.status).toBe(200);
    expect(res.body.sources).toEqual([expect.objectContaining({ ...sources[0], priceBreaks: sources[0].priceBreaks })]);
    expect((await send('put', `/api/parts/${part.id}/sources`, 'buyer', { sources, version: part.version })).status).toBe(409);
  });
});

// DELETE carries Content-Type: application/json, as the islands send it: Astro's origin check treats a
// body-less DELETE like a form post.
describe('DELETE /api/parts/:id', () => {
  it('librarians only, refused when stale, then gone with a trail entry', async () => {
    const part = (await send('post', '/api/parts', 'librarian', newDiode())).body;
    expect(
      (await request(appUrl()).delete(`/api/parts/${part.id}`).set('Cookie', cookies.designer).set('Content-Type', 'application/json'))
        .status,
    ).toBe(403);
    expect(
      (
        await request(appUrl())
          .delete(`/api/parts/${part.id}?version=7`)
          .set('Cookie', cookies.librarian)
          .set('Content-Type', 'application/json')
      ).status,
    ).toBe(409);
    expect(
      (
        await request(appUrl())
          .delete(`/api/parts/${part.id}?version=1`)
          .set('Cookie', cookies.librarian)
          .set('Content-Type', 'application/json')
      ).status,
    ).toBe(204);
    expect((await request(appUrl()).get(`/api/parts/${part.id}`).set('Cookie', cookies.librarian)).status).toBe(404);
    expect(await knex('part_sources').where({ part_id: part.id })).toEqual([]);
    expect((await events(part.id)).at(-1).action).toBe('part.delete');
  });
});
