/**
 * Change alerts (issue 13 item 5): a part moving to NRND, last-buy or obsolete flags every design using it
 * (chosen or alternate, ready or draft); a change that makes a ready design fail flags it too; each alert is
 * mailed once to the design's owner and the buyers, even when several servers process it at once; a banner
 * stays on the design and the home page until someone acknowledges it (who and when recorded).
 * Expected sets are the designs this file builds (written out here), not read from the code under test.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { Knex } from 'knex';
import { appDb, appUrl } from '../helpers/stack.ts';
import { demoAddress, sessionCookie } from '../helpers/session.ts';
import type { DesignInput } from '../../src/lib/domain/design.ts';
import { demoDesigns } from '../../db/seeds/designs.ts';
import { editParams, getDesign, getPart, lifecycle as changeLifecycle, markReady } from '../helpers/design-api.ts';
import { processPendingAlerts } from '../../src/server/services/design-alerts.ts';

const knex = appDb();
const second = appDb();
const api = () => request(appUrl());
let designer = '';
let buyer = '';

beforeAll(async () => {
  [designer, buyer] = await Promise.all([sessionCookie('designer'), sessionCookie('buyer')]);
});
afterAll(async () => {
  await Promise.all([knex.destroy(), second.destroy()]);
});

const fanName = demoDesigns[1].name;
const lifecycle = (id: number, to: string, version: number) => changeLifecycle(id, to, version, 'alert test');

async function fanCopy(tag: string, ready: boolean, change?: (i: DesignInput) => DesignInput): Promise<{ id: number; input: DesignInput }> {
  const fanId = (await knex('designs').where({ name: fanName }).first('id')).id;
  let input = { ...(await getDesign(fanId)).input, name: `Alerts ${tag} ${Date.now()}` } as DesignInput;
  if (change) input = change(input);
  const created = await api().post('/api/designs').set('Cookie', designer).send(input);
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  if (ready) {
    const r = await markReady(created.body.id, created.body.version);
    expect(r.status, JSON.stringify(r.body)).toBe(200);
  }
  return { id: created.body.id, input };
}

const alertsOf = (designId: number) => knex('design_alerts').where({ design_id: designId }).orderBy('id');

describe('a part moving to obsolete', () => {
  it('flags every design using it, chosen or alternate, ready or draft, once per design', async () => {
    const chosenReady = await fanCopy('chosen-ready', true);
    const partId = chosenReady.input.selections.switch.chosenPartId as number;
    // A draft that lists the same part only as an alternate (its chosen switch is the fan's first alternate).
    const alternateDraft = await fanCopy('alternate-draft', false, (i) => ({
      ...i,
      selections: {
        ...i.selections,
        switch: { chosenPartId: i.selections.switch.alternatePartIds[0], alternatePartIds: [partId] },
      },
    }));
    const unrelated = await fanCopy('unrelated', false, (i) => ({
      ...i,
      selections: { ...i.selections, switch: { chosenPartId: i.selections.switch.alternatePartIds[0], alternatePartIds: [] } },
    }));
    const before = await getPart(partId);
    const mailBefore = Number((await knex('captured_mail').max({ m: 'id' }))[0].m ?? 0);

    const res = await lifecycle(partId, 'obsolete', before.version);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    try {
      for (const d of [chosenReady, alternateDraft]) {
        const rows = await alertsOf(d.id);
        expect(rows.map((r) => [r.part_id, r.kind])).toContainEqual([partId, 'lifecycle']);
        expect(rows.filter((r) => r.kind === 'lifecycle')).toHaveLength(1);
        expect(rows.find((r) => r.kind === 'lifecycle').detail).toContain(before.mpn);
      }
      expect(await alertsOf(unrelated.id)).toHaveLength(0);
      // The ready copy no longer holds with an obsolete chosen switch: it is flagged for that as well.
      expect((await alertsOf(chosenReady.id)).map((r) => r.kind)).toContain('no-longer-holds');

      // Two more "servers" process the same alerts while the app's own background run may still be going.
      await Promise.all([processPendingAlerts(knex), processPendingAlerts(second)]);
      const ids = [chosenReady.id, alternateDraft.id];
      const open = await knex('design_alerts').whereIn('design_id', ids);
      expect(open.every((r) => r.sent_at !== null)).toBe(true);
      const mail = await knex('captured_mail').where('id', '>', mailBefore).select('envelope_to', 'subject', 'text_body');
      for (const d of [chosenReady, alternateDraft]) {
        const mine = open.filter((r) => r.design_id === d.id).length;
        const subject = `Stallpoint alert: ${d.input.name}`;
        // One mail per alert to the owner (the demo designer) and one to the demo buyer: never twice.
        expect(mail.filter((m) => m.subject === subject && m.envelope_to.includes(demoAddress('designer')))).toHaveLength(mine);
        expect(mail.filter((m) => m.subject === subject && m.envelope_to.includes(demoAddress('buyer')))).toHaveLength(mine);
      }
      const body = mail.find((m) => m.subject === `Stallpoint alert: ${chosenReady.input.name}`)!.text_body;
      expect(body).toContain(before.mpn);
      expect(body).toContain('Parts that pass this design now');
      // Processing again sends nothing more.
      expect(await processPendingAlerts(knex)).toBe(0);
    } finally {
      const now = await getPart(partId);
      await lifecycle(partId, before.lifecycle, now.version);
    }
  });
});

describe('a parameter change that breaks a ready design', () => {
  it('flags it as no longer holding, naming the part', async () => {
    const { id, input } = await fanCopy('params', true);
    const altId = input.selections.switch.alternatePartIds[0];
    const part = await getPart(altId);
    const original = part.params as unknown as Record<string, unknown>;
    // 12.6 V supply maximum against a 10 V drain rating: a hard fail (docs/engineering.md §5 drain-voltage check).
    const res = await editParams(altId, (p) => ({ ...p, vdsMaxV: 10 }));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    try {
      const rows = await alertsOf(id);
      expect(rows.map((r) => [r.part_id, r.kind])).toEqual([[altId, 'no-longer-holds']]);
      expect(rows[0].detail).toContain(part.mpn);
      expect((await getDesign(id)).status).toBe('draft');
    } finally {
      await editParams(altId, () => original);
    }
  });
});

describe('acknowledging an alert', () => {
  async function openAlert(db: Knex): Promise<{ id: number; designId: number }> {
    const { id } = await fanCopy('ack', false);
    const partId = (await db('design_parts').where({ design_id: id, role: 'diode' }).first('part_id')).part_id;
    const [alertId] = await db('design_alerts').insert({
      design_id: id,
      part_id: partId,
      kind: 'lifecycle',
      change_key: `test-${Date.now()}`,
      detail: 'Test alert: the diode moved to NRND.',
      sent_at: new Date(),
    });
    return { id: alertId, designId: id };
  }

  it('shows the banner on the design and the home page until acknowledged, and records who and when', async () => {
    const alert = await openAlert(knex);
    const page = async (path: string, cookie: string) => (await api().get(path).set('Cookie', cookie)).text;
    expect(await page(`/designs/${alert.designId}`, designer)).toContain('Test alert: the diode moved to NRND.');
    expect(await page('/', buyer)).toContain('Test alert: the diode moved to NRND.');

    const ack = await api().post(`/api/alerts/${alert.id}/acknowledge`).set('Cookie', buyer).send({});
    expect(ack.status, JSON.stringify(ack.body)).toBe(200);
    const row = await knex('design_alerts').where({ id: alert.id }).first();
    const buyerId = (
      await knex('users')
        .where({ email: demoAddress('buyer') })
        .first('id')
    ).id;
    expect(row.acknowledged_by).toBe(buyerId);
    expect(row.acknowledged_at).not.toBeNull();
    const audit = await knex('audit_events').where({ action: 'design.alert_acknowledged', entity_id: alert.designId }).first();
    expect(audit?.actor_user_id).toBe(buyerId);

    expect(await page(`/designs/${alert.designId}`, designer)).not.toContain('Test alert: the diode moved to NRND.');
    expect(await page('/', buyer)).not.toContain('Test alert: the diode moved to NRND.');
    const again = await api().post(`/api/alerts/${alert.id}/acknowledge`).set('Cookie', designer).send({});
    expect(again.status).toBe(409);
    expect(again.body.issues[0].path).toBe('id');
    const missing = await api().post('/api/alerts/999999999/acknowledge').set('Cookie', designer).send({});
    expect(missing.status).toBe(404);
  });
});
