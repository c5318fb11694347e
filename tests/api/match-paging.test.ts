/**
 * Match answers are pages of the full ranking: concatenated pages give the whole list in order, the
 * counts by verdict equal the engineering core run on ALL eligible candidates of the demo catalogue
 * (second method: the core called directly on every approved, non-obsolete part, no SQL narrowing),
 * and the design's picks always come along, wherever they rank.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';
import { hydrateParts } from '../../src/server/repos/parts.ts';
import { rankDesign } from '../../src/lib/rank-design.ts';
import { designCaseOf } from '../../src/lib/design-input.ts';
import type { DesignInput } from '../../src/lib/domain/design.ts';
import type { PartOf } from '../../src/lib/domain/parts.ts';
import type { DesignMatchPage } from '../../src/lib/match-page.ts';
import { demoDesigns } from '../../db/seeds/designs.ts';

const knex = appDb();
const api = () => request(appUrl());
let designer = '';

beforeAll(async () => {
  designer = await sessionCookie('designer');
});
afterAll(() => knex.destroy());

async function designFor(name: string): Promise<{ id: number; input: DesignInput }> {
  const row = await knex('designs').where({ name }).first('id');
  const design = (await api().get(`/api/designs/${row.id}`).set('Cookie', designer)).body as { input: DesignInput };
  return { id: row.id, input: design.input };
}

const match = async (id: number, body: object): Promise<DesignMatchPage> => {
  const res = await api().post(`/api/designs/${id}/match`).set('Cookie', designer).send(body);
  expect(res.status).toBe(200);
  return res.body as DesignMatchPage;
};

async function eligible<C extends 'mosfet' | 'driver' | 'diode'>(category: C): Promise<PartOf<C>[]> {
  const rows = await knex('parts').where({ category, review_status: 'approved' }).whereNot('lifecycle', 'obsolete');
  return (await hydrateParts(knex, rows)) as PartOf<C>[];
}

const verdictCounts = (list: { verdict: string }[]) => ({
  pass: list.filter((e) => e.verdict === 'pass').length,
  marginal: list.filter((e) => e.verdict === 'marginal').length,
  fail: list.filter((e) => e.verdict === 'fail').length,
});

describe.each(demoDesigns.map((d) => d.name))('match pages of "%s"', (name) => {
  it('pages of 7 put together are the full ranking, in order, with the full ranking’s counts', async () => {
    const { id } = await designFor(name);
    const full = await match(id, { limit: 500 });
    for (const key of ['switch', 'switchWithDriver', 'driver', 'diode'] as const) {
      const all = full[key];
      expect(full.lists[key].total).toBe(all.length);
      expect(all.every((e) => !e.pinned)).toBe(true);
      expect(full.lists[key].counts).toEqual(verdictCounts(all));
      // Recounted by hand from the full list: each failing part once per hard check it breaks.
      const byCheck = new Map<string, number>();
      for (const e of all.filter((x) => x.verdict === 'fail'))
        for (const c of e.checks.filter((x) => !x.ok && x.severity !== 'margin')) byCheck.set(c.id, (byCheck.get(c.id) ?? 0) + 1);
      expect(Object.fromEntries(full.lists[key].failing.map((f) => [f.checkId, f.count]))).toEqual(Object.fromEntries(byCheck));
      const paged: number[] = [];
      for (let offset = 0; offset < all.length; offset += 7) {
        const page = await match(id, { limit: 7, offset });
        expect(page.lists[key].total).toBe(all.length);
        expect(page.lists[key].counts).toEqual(full.lists[key].counts);
        expect(page.lists[key].summary).toBe(full.lists[key].summary);
        paged.push(...page[key].filter((e) => !e.pinned).map((e) => e.partId as number));
        expect(page[key].filter((e) => !e.pinned).map((e) => e.rank)).toEqual(
          Array.from({ length: Math.min(7, all.length - offset) }, (_, i) => offset + i + 1),
        );
      }
      expect(paged).toEqual(all.map((e) => e.partId));
    }
  });

  it('counts by verdict agree with the core run on every eligible part (SQL leaves out only failures)', async () => {
    const { id, input } = await designFor(name);
    if (input.motor.source !== 'catalogue') throw new Error('catalogue motor expected');
    const page = await match(id, {});
    const [mosfets, drivers, diodes] = await Promise.all([eligible('mosfet'), eligible('driver'), eligible('diode')]);
    const motorRow = await knex('parts').where({ id: input.motor.partId });
    const motor = (await hydrateParts(knex, motorRow))[0] as PartOf<'motor'>;
    const core = rankDesign(
      designCaseOf(input, motor.params),
      { mosfets, drivers, diodes },
      {
        switchId: input.selections.switch.chosenPartId,
        driverId: input.selections.driver.chosenPartId,
        diodeId: input.selections.diode.chosenPartId,
        resetStartIntended: input.resetStartIntent != null,
      },
    );
    expect(page.driverNeeded).toBe(core.driverNeeded);
    const key = core.driverNeeded ? 'switchWithDriver' : 'switch';
    const want = verdictCounts(core[key]);
    expect(page.lists[key].counts.pass).toBe(want.pass);
    expect(page.lists[key].counts.marginal).toBe(want.marginal);
    expect(page.lists[key].counts.fail + page.excluded.switch).toBe(want.fail);
    const diodesWant = verdictCounts(core.diode);
    expect(page.lists.diode.counts.pass).toBe(diodesWant.pass);
    expect(page.lists.diode.counts.fail + page.excluded.diode).toBe(diodesWant.fail);
    // The best entries are the core's best: the same first part of the effective switch list.
    expect(page[key][0]?.verdict).toBe(core[key][0]?.verdict);
  });

  it('carries the picks even when they rank outside the page', async () => {
    const { id, input } = await designFor(name);
    const full = await match(id, { limit: 500 });
    const list = full.driverNeeded ? full.switchWithDriver : full.switch;
    const last = list[list.length - 1];
    if (!last || list.length < 3) return;
    const pick = { chosenPartId: last.partId, alternatePartIds: [] };
    const page = await match(id, { limit: 1, input: { ...input, selections: { ...input.selections, switch: pick } } });
    const shown = page.driverNeeded ? page.switchWithDriver : page.switch;
    const pinned = shown.find((e) => e.partId === last.partId);
    expect(pinned?.pinned).toBe(true);
    expect(pinned?.rank).toBeGreaterThan(1);
  });
});

describe('match paging input', () => {
  it('refuses a limit that is not a whole number from 1, naming the field', async () => {
    const { id } = await designFor(demoDesigns[0].name);
    const res = await api().post(`/api/designs/${id}/match`).set('Cookie', designer).send({ limit: 0 });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.issues)).toContain('limit');
  });
});
