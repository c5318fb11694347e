/**
 * Four-eyes review through the API (issue 14 item 7): nobody approves a part they created or last edited;
 * another librarian may; an admin may approve their own, recorded as an admin override; rejecting needs a
 * reason and the refusal says what to do.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie, type DemoRole } from '../helpers/session.ts';
import { createPerson, sessionCookie as personCookie, uniqueEmail } from './auth-helpers.ts';

const knex = appDb();
const cookies = {} as Record<DemoRole | 'secondLibrarian', string>;
beforeAll(async () => {
  for (const role of ['admin', 'librarian', 'designer'] as const) cookies[role] = await sessionCookie(role);
  const email = uniqueEmail('second.librarian');
  await createPerson(knex, { email, password: 'a long unused test password', roles: ['librarian'], name: 'Second Librarian' });
  cookies.secondLibrarian = await personCookie(knex, email);
});
afterAll(() => knex.destroy());

type Who = keyof typeof cookies;
let serial = 0;
/** A fresh invented diode (Ostler style numbers with a test suffix so reruns never collide). */
function newDiode(overrides: Record<string, unknown> = {}): Record<string, unknown> {
  serial += 1;
  return {
    category: 'diode',
    manufacturer: 'Ostler Rectifier Works',
    mpn: `ORS${40 + serial}-45-FE-T${Date.now().toString(36)}`,
    description: 'Four-eyes test Schottky diode, 45 V',
    package: 'SMB',
    params: { kind: 'schottky', vrrmV: 45, ifAvA: 2, ifsmA: 50, vfV: 0.55, vfAtIfA: 2, trrNs: null },
    reviewStatus: 'pending',
    ...overrides,
  };
}
const send = (method: 'post' | 'put', path: string, who: Who, body: unknown) =>
  request(appUrl())[method](path).set('Content-Type', 'application/json').set('Cookie', cookies[who]).send(JSON.stringify(body));
const review = (part: { id: number; version: number }, who: Who, decision: 'approve' | 'reject', reason?: string) =>
  send('post', `/api/parts/${part.id}/review`, who, { decision, version: part.version, ...(reason === undefined ? {} : { reason }) });
const lastEvent = async (id: number) =>
  knex('audit_events').where({ entity_type: 'part', entity_id: id }).orderBy('id', 'desc').first('action', 'note');

describe('four-eyes approval', () => {
  it('a librarian cannot approve a part they created (403 naming the rule); another librarian can', async () => {
    const created = await send('post', '/api/parts', 'librarian', newDiode());
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body.reviewStatus).toBe('pending');
    const own = await review(created.body, 'librarian', 'approve');
    expect(own.status).toBe(403);
    // Creating a part is also its last edit (the create event carries its content).
    expect(own.body.error).toBe('Four-eyes rule: you created and last edited this part, so another librarian must approve it.');
    // nothing half-written: still pending at the same version, no approval in the trail
    const row = await knex('parts').where({ id: created.body.id }).first('review_status', 'version');
    expect(row).toEqual({ review_status: 'pending', version: created.body.version });
    expect((await lastEvent(created.body.id)).action).toBe('part.create');

    const other = await review(created.body, 'secondLibrarian', 'approve');
    expect(other.status, JSON.stringify(other.body)).toBe(200);
    expect(other.body.reviewStatus).toBe('approved');
    expect(await lastEvent(created.body.id)).toEqual({ action: 'part.approve', note: null });
  });

  it('a librarian who last edited a proposal cannot approve it; the proposal’s author is not a reviewer either', async () => {
    const proposed = (await send('post', '/api/parts', 'designer', newDiode())).body;
    const edited = await send('put', `/api/parts/${proposed.id}`, 'librarian', { ...proposed, package: 'SMA' });
    expect(edited.status, JSON.stringify(edited.body)).toBe(200);
    const own = await review(edited.body, 'librarian', 'approve');
    expect(own.status).toBe(403);
    expect(own.body.error).toContain('you last edited this part');
    expect((await review(edited.body, 'secondLibrarian', 'approve')).status).toBe(200);
  });

  it('an admin may approve their own part; the audit event records the admin override', async () => {
    const created = (await send('post', '/api/parts', 'admin', newDiode())).body;
    expect(created.reviewStatus).toBe('pending');
    const approved = await review(created, 'admin', 'approve');
    expect(approved.status, JSON.stringify(approved.body)).toBe(200);
    const event = await lastEvent(created.id);
    expect(event.action).toBe('part.approve');
    expect(event.note).toBe('Admin override of the four-eyes rule: the approver created and last edited this part.');
  });

  it('an admin approving someone else’s part is an ordinary approval, not an override', async () => {
    const created = (await send('post', '/api/parts', 'librarian', newDiode())).body;
    expect((await review(created, 'admin', 'approve')).status).toBe(200);
    expect(await lastEvent(created.id)).toEqual({ action: 'part.approve', note: null });
  });
});

describe('rejecting needs a reason', () => {
  it.each([
    ['no reason at all', undefined],
    ['an empty reason', ''],
    ['only spaces', '   '],
  ])('%s is refused with a message that says what to do, naming the field', async (_name, reason) => {
    const proposed = (await send('post', '/api/parts', 'designer', newDiode())).body;
    const res = await review(proposed, 'librarian', 'reject', reason);
    expect(res.status).toBe(400);
    expect(res.body.error).toBe('Give a reason to reject: say what is wrong so the proposer can fix it.');
    expect(res.body.error).not.toContain('Some fields are not valid');
    expect(res.body.issues.map((i: { path: string }) => i.path)).toEqual(['reason']);
    expect((await knex('parts').where({ id: proposed.id }).first('review_status')).review_status).toBe('pending');
  });
});
