/**
 * The home page per role (issue 13 item 6). Which sections each role sees is written from README "Roles"
 * (designers own designs; librarians review, import and keep datasheets; buyers buy; admins all plus
 * people), and the figures are counted here with plain SQL, not taken from the page's service.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { demoAddress, sessionCookie, type DemoRole } from '../helpers/session.ts';
import { demoDesigns } from '../../db/seeds/designs.ts';

const knex = appDb();
const api = () => request(appUrl());
const cookies: Partial<Record<DemoRole, string>> = {};
beforeAll(async () => {
  for (const r of ['designer', 'librarian', 'buyer', 'admin'] as const) cookies[r] = await sessionCookie(r);
});
afterAll(() => knex.destroy());

const SECTIONS = ['desk-designs', 'desk-review', 'desk-datasheets', 'desk-imports', 'desk-shortlists', 'desk-people'] as const;
// Hand-written from README "Roles": ✓ = the role's home page shows the section.
const SEES: Record<'designer' | 'librarian' | 'buyer' | 'admin', (typeof SECTIONS)[number][]> = {
  designer: ['desk-designs'],
  librarian: ['desk-review', 'desk-datasheets', 'desk-imports'],
  buyer: ['desk-shortlists'],
  admin: ['desk-designs', 'desk-review', 'desk-datasheets', 'desk-imports', 'desk-shortlists', 'desk-people'],
};

const home = async (role: DemoRole) => {
  const res = await api().get('/').set('Cookie', cookies[role]!);
  expect(res.status).toBe(200);
  return res.text;
};

describe('home page per role', () => {
  it.each(Object.entries(SEES))('%s sees exactly its sections', async (role, sections) => {
    const html = await home(role as DemoRole);
    for (const s of SECTIONS) expect(html.includes(`data-testid="${s}"`), `${role} ${s}`).toBe(sections.includes(s));
  });

  it("lists the designer's own designs with the count", async () => {
    const me = (
      await knex('users')
        .where({ email: demoAddress('designer') })
        .first('id')
    ).id;
    const [{ n }] = await knex('designs').where({ owner_id: me }).count({ n: '*' });
    const html = await home('designer');
    expect(html).toContain(`All your designs (${Number(n)})`);
    const newest = await knex('designs').where({ owner_id: me }).orderBy('updated_at', 'desc').first('name');
    expect(html).toContain(newest.name);
  });

  it('tells the librarian how many parts wait for review and how many approved parts have no datasheet', async () => {
    const [{ n: pending }] = await knex('parts').where({ review_status: 'pending' }).count({ n: '*' });
    const [{ n: bare }] = await knex('parts as p')
      .where('p.review_status', 'approved')
      .whereRaw('NOT EXISTS (SELECT 1 FROM datasheets d WHERE d.part_id = p.id)')
      .count({ n: '*' });
    const html = await home('librarian');
    const p = Number(pending);
    expect(html).toContain(p === 1 ? '1 part waits for review' : `${p} parts wait for review`);
    if (Number(bare) > 0) expect(html).toContain(`${Number(bare)} part${Number(bare) === 1 ? ' has' : 's have'} none on file`);
    else expect(html).toContain('Every approved part has a datasheet on file.');
  });

  it("flags a buyer's shortfall when a chosen part's stock is below the build quantity", async () => {
    const fan = await knex('designs').where({ name: demoDesigns[1].name }).first('id', 'status', 'current_revision');
    expect(fan.status).toBe('ready');
    const before = await home('buyer');
    expect(before).toContain(demoDesigns[1].name);
    const switchId = (await knex('design_parts').where({ design_id: fan.id, role: 'switch', position: 0 }).first('part_id')).part_id;
    const mpn = (await knex('parts').where({ id: switchId }).first('mpn')).mpn;
    const stock = await knex('part_sources').where({ part_id: switchId }).select('id', 'stock_qty');
    await knex('part_sources').where({ part_id: switchId }).update({ stock_qty: 0 });
    try {
      const html = await home('buyer');
      expect(html).toMatch(new RegExp(`Short: ${mpn} \\(switch\\) 0 in stock, [0-9,]+ needed`));
    } finally {
      for (const s of stock) await knex('part_sources').where({ id: s.id }).update({ stock_qty: s.stock_qty });
    }
  });
});

describe('the home shortfall counts attrition as the shortlist does', () => {
  it('flags 505 in stock for the 500-board fan: need 500 × 1.02 = 510 (hand figure, default 2 % attrition)', async () => {
    const fan = await knex('designs').where({ name: demoDesigns[1].name }).first('id');
    const switchId = (await knex('design_parts').where({ design_id: fan.id, role: 'switch', position: 0 }).first('part_id')).part_id;
    const mpn = (await knex('parts').where({ id: switchId }).first('mpn')).mpn;
    const stock = await knex('part_sources').where({ part_id: switchId }).select('id', 'stock_qty');
    expect(stock.length, 'the fan switch has a source').toBeGreaterThan(0);
    await knex('part_sources').where({ part_id: switchId }).update({ stock_qty: 0 });
    await knex('part_sources').where({ id: stock[0].id }).update({ stock_qty: 505 });
    try {
      const html = await home('buyer');
      expect(html).toMatch(new RegExp(`Short: ${mpn} \\(switch\\) 505 in stock, 510 needed`));
      // At 510 in stock nothing is missing any more.
      await knex('part_sources').where({ id: stock[0].id }).update({ stock_qty: 510 });
      expect(await home('buyer')).not.toMatch(new RegExp(`Short: ${mpn} \\(switch\\)`));
    } finally {
      for (const s of stock) await knex('part_sources').where({ id: s.id }).update({ stock_qty: s.stock_qty });
    }
  });
});
