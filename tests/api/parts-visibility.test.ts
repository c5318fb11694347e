/**
 * Who sees which parts in the list and the export: librarians and admins every part; designers and buyers
 * approved parts and their own proposals, whatever review-status filter they send (a draft, a pending
 * proposal of someone else and a rejected part stay hidden). OWASP ASVS 5.0 V8.2.2 (data-level access).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import Papa from 'papaparse';
import { appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';

type Role = 'designer' | 'buyer' | 'librarian' | 'admin';
const cookies = {} as Record<Role, string>;
const stamp = Date.now().toString(36).toUpperCase();
const mpns = { proposal: `VIS-P${stamp}`, draft: `VIS-D${stamp}`, rejected: `VIS-R${stamp}` };
const ids = {} as Record<keyof typeof mpns, number>;

const diode = (mpn: string, reviewStatus?: string) => ({
  category: 'diode',
  manufacturer: 'Invented Rectifiers',
  mpn,
  ...(reviewStatus ? { reviewStatus } : {}),
  params: { kind: 'schottky', vrrmV: 40, ifAvA: 1, ifsmA: 25, vfV: 0.45, vfAtIfA: 1 },
});
const post = (role: Role, path: string, body: unknown) =>
  request(appUrl()).post(path).set('Cookie', cookies[role]).set('Content-Type', 'application/json').send(JSON.stringify(body));

async function listed(role: Role, query: Record<string, string>): Promise<{ mpn: string; reviewStatus: string }[]> {
  const res = await request(appUrl())
    .get('/api/parts')
    .query({ pageSize: 200, ...query })
    .set('Cookie', cookies[role]);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  expect(res.body.total).toBeLessThanOrEqual(200);
  return res.body.items;
}

beforeAll(async () => {
  for (const role of ['designer', 'buyer', 'librarian', 'admin'] as const) cookies[role] = await sessionCookie(role);
  const proposal = (await post('designer', '/api/parts', diode(mpns.proposal))).body;
  expect(proposal.reviewStatus).toBe('pending');
  const draft = (await post('librarian', '/api/parts', diode(mpns.draft, 'draft'))).body;
  expect(draft.reviewStatus).toBe('draft');
  const toReject = (await post('designer', '/api/parts', diode(mpns.rejected))).body;
  Object.assign(ids, { proposal: proposal.id, draft: draft.id, rejected: toReject.id });
  const res = await post('librarian', `/api/parts/${toReject.id}/review`, {
    decision: 'reject',
    reason: 'duplicate entry',
    version: toReject.version,
  });
  expect(res.body.reviewStatus).toBe('rejected');
});

const NOT_APPROVED = { reviewStatus: 'draft,pending,rejected', category: 'diode' };

describe('GET /api/parts?reviewStatus=…', () => {
  it.each(['librarian', 'admin'] as const)('%s sees drafts, proposals and rejected parts', async (role) => {
    const seen = (await listed(role, NOT_APPROVED)).map((p) => p.mpn);
    expect(seen).toEqual(expect.arrayContaining(Object.values(mpns)));
  });

  it('a designer sees their own proposals (pending and rejected) but not a librarian draft', async () => {
    const seen = (await listed('designer', NOT_APPROVED)).map((p) => p.mpn);
    expect(seen).toContain(mpns.proposal);
    expect(seen).toContain(mpns.rejected);
    expect(seen).not.toContain(mpns.draft);
  });

  it('a buyer sees no part that is not approved, whatever the filter', async () => {
    expect(await listed('buyer', NOT_APPROVED)).toEqual([]);
    expect(await listed('buyer', { reviewStatus: 'pending' })).toEqual([]);
    const all = await listed('buyer', { category: 'diode' });
    expect(all.length).toBeGreaterThan(0);
    expect(all.filter((p) => p.reviewStatus !== 'approved')).toEqual([]);
  });

  it('the CSV export follows the same rule', async () => {
    const res = await request(appUrl()).get('/api/parts.csv').query(NOT_APPROVED).set('Cookie', cookies.buyer);
    expect(res.status).toBe(200);
    expect(res.headers['x-row-count']).toBe('0');
    const designer = await request(appUrl()).get('/api/parts.csv').query(NOT_APPROVED).set('Cookie', cookies.designer);
    const rows = Papa.parse<Record<string, string>>(designer.text, { header: true, skipEmptyLines: true, delimiter: ',' }).data;
    expect(rows.map((r) => r.mpn)).toEqual(expect.arrayContaining([mpns.proposal, mpns.rejected]));
    expect(rows.map((r) => r.mpn)).not.toContain(mpns.draft);
  });
});

/**
 * One part by id (API record and page), written by hand from README "Roles": librarians and admins read
 * every part; a designer their own proposal (pending or rejected) but not a librarian's draft; a buyer
 * proposed nothing, so none of the three. Hidden reads as 404, like a missing part.
 */
const SINGLE: [Role, keyof typeof mpns, 200 | 404][] = [
  ['librarian', 'proposal', 200],
  ['librarian', 'draft', 200],
  ['librarian', 'rejected', 200],
  ['admin', 'proposal', 200],
  ['admin', 'draft', 200],
  ['admin', 'rejected', 200],
  ['designer', 'proposal', 200],
  ['designer', 'rejected', 200],
  ['designer', 'draft', 404],
  ['buyer', 'proposal', 404],
  ['buyer', 'draft', 404],
  ['buyer', 'rejected', 404],
];

describe('GET /api/parts/:id and /parts/:id', () => {
  it.each(SINGLE)('%s reading the %s part gets %i', async (role, which, status) => {
    const api = await request(appUrl()).get(`/api/parts/${ids[which]}`).set('Cookie', cookies[role]);
    expect(api.status, JSON.stringify(api.body)).toBe(status);
    if (status === 200) expect(api.body.mpn).toBe(mpns[which]);
    else expect(JSON.stringify(api.body)).not.toContain(mpns[which]);
    const page = await request(appUrl()).get(`/parts/${ids[which]}`).set('Cookie', cookies[role]);
    expect(page.status).toBe(status);
    if (status === 200) expect(page.text).toContain(mpns[which]);
    else expect(page.text).not.toContain(mpns[which]);
  });
});
