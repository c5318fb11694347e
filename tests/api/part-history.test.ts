/**
 * The part page's history in words (issue 14 item 8): a save with no change writes nothing (no version
 * bump, no audit event, no empty "Edited" entry); adding an RDS(on) line reads as one line in mΩ with its
 * conditions, a rating change as "VDS max 30 V → 40 V", never as field paths.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';

const knex = appDb();
let librarian = '';
beforeAll(async () => {
  librarian = await sessionCookie('librarian');
});
afterAll(() => knex.destroy());

const get = (path: string) => request(appUrl()).get(path).set('Cookie', librarian);
const put = (path: string, body: unknown) =>
  request(appUrl()).put(path).set('Cookie', librarian).set('Content-Type', 'application/json').send(JSON.stringify(body));
const updates = async (id: number) =>
  knex('audit_events').where({ entity_type: 'part', entity_id: id, action: 'part.update' }).count({ n: '*' }).first();
/** The history section's text, spaces collapsed. */
const historyText = (html: string): string => {
  const from = html.indexOf('id="h-history"');
  return html
    .slice(from, html.indexOf('</section>', from))
    .replace(/<[^>]+>/g, ' ')
    .replace(/\s+/g, ' ');
};

describe('part history', () => {
  it('a save with no change writes no version and no audit event', async () => {
    const row = await knex('parts').where({ category: 'diode', review_status: 'approved' }).orderBy('id').first('id');
    const part = (await get(`/api/parts/${row.id}`)).body;
    const before = Number((await updates(row.id))!.n);
    const same = await put(`/api/parts/${row.id}`, part);
    expect(same.status, JSON.stringify(same.body)).toBe(200);
    expect(same.body.version).toBe(part.version);
    expect((await knex('parts').where({ id: row.id }).first('version')).version).toBe(part.version);
    expect(Number((await updates(row.id))!.n)).toBe(before);
    expect(historyText((await get(`/parts/${row.id}`)).text)).not.toContain('Edited');
  });

  it('an added RDS(on) line and a new VDS rating read as two lines in datasheet units', async () => {
    const row = await knex('parts').where({ category: 'mosfet', review_status: 'approved' }).orderBy('id').first('id');
    const part = (await get(`/api/parts/${row.id}`)).body;
    const vds = part.params.vdsMaxV as number;
    const edited = {
      ...part,
      params: {
        ...part.params,
        vdsMaxV: vds + 10,
        rdsOn: [...part.params.rdsOn, { vgsV: 3.3, tjC: 70, maxOhm: 0.032, typOhm: null, idA: null }],
      },
    };
    const saved = await put(`/api/parts/${row.id}`, edited);
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    expect(saved.body.version).toBe(part.version + 1);
    const text = historyText((await get(`/parts/${row.id}`)).text);
    expect(text).toContain('Edited');
    // 0.032 Ω is 32 mΩ; the line's gate drive and junction temperature follow it.
    expect(text).toContain('added RDS(on) line 32 mΩ at 3.3 V, 70 °C');
    expect(text).toContain(`VDS max ${vds} V → ${vds + 10} V`);
    expect(text).not.toMatch(/params\.|rdsOn|fields? changed/);
  });
});
