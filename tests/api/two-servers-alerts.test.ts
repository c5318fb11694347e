/**
 * Change alerts with two real app server processes (tests/helpers/app-processes.ts), both sweeping unsent
 * alerts every 0.2 s (ALERT_SWEEP_S) while one of them takes the part change and mails in the background
 * as well: three senders race for the same alerts. Expectations (issue 13 item 5, written out here from
 * the designs this file builds): every design using the part, as chosen or as alternate, is flagged once
 * for the move to obsolete, a design not using it is not, and every alert reaches the owner and the buyers
 * exactly once, counted in the local mail sink's capture (captured_mail).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { demoAddress, sessionCookie } from '../helpers/session.ts';
import { startAppProcesses, stopAll, type AppProcess } from '../helpers/app-processes.ts';
import type { DesignInput } from '../../src/lib/domain/design.ts';
import { demoDesigns } from '../../db/seeds/designs.ts';
import { getDesign, getPart, lifecycle as changeLifecycle, markReady } from '../helpers/design-api.ts';

const knex = appDb();
const api = () => request(appUrl());
let designer = '';
let librarian = '';
let procs: AppProcess[] = [];
const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

beforeAll(async () => {
  [designer, librarian] = await Promise.all([sessionCookie('designer'), sessionCookie('librarian')]);
  procs = await startAppProcesses(2, { ALERT_SWEEP_S: '0.2' });
}, 120_000);
afterAll(async () => {
  await stopAll(procs);
  await knex.destroy();
});

const fanName = demoDesigns[1].name;

async function fanCopy(tag: string, ready: boolean, change?: (i: DesignInput) => DesignInput): Promise<{ id: number; input: DesignInput }> {
  const fanId = (await knex('designs').where({ name: fanName }).first('id')).id;
  let input = { ...(await getDesign(fanId)).input, name: `Two servers ${tag} ${Date.now()}` } as DesignInput;
  if (change) input = change(input);
  const created = await api().post('/api/designs').set('Cookie', designer).send(input);
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  if (ready) {
    const r = await markReady(created.body.id, created.body.version);
    expect(r.status, JSON.stringify(r.body)).toBe(200);
  }
  return { id: created.body.id, input };
}

describe('a part made obsolete with two app server processes running', () => {
  it('flags each design using it once and mails each alert once', async () => {
    const chosenReady = await fanCopy('chosen-ready', true);
    const chosenDraft = await fanCopy('chosen-draft', false);
    const partId = chosenReady.input.selections.switch.chosenPartId as number;
    const asAlternate = (i: DesignInput): DesignInput => ({
      ...i,
      selections: { ...i.selections, switch: { chosenPartId: i.selections.switch.alternatePartIds[0], alternatePartIds: [partId] } },
    });
    const alternateDraft = await fanCopy('alternate-draft', false, asAlternate);
    const alternateReady = await fanCopy('alternate-ready', true, asAlternate);
    const unrelated = await fanCopy('unrelated', false, (i) => ({
      ...i,
      selections: { ...i.selections, switch: { chosenPartId: i.selections.switch.alternatePartIds[0], alternatePartIds: [] } },
    }));
    const using = [chosenReady, chosenDraft, alternateDraft, alternateReady];
    const before = await getPart(partId);
    const mailBefore = Number((await knex('captured_mail').max({ m: 'id' }))[0].m ?? 0);

    // The change goes to the first process (which then mails in the background); both sweep meanwhile.
    const res = await request(procs[0].url)
      .post(`/api/parts/${partId}/lifecycle`)
      .set('Cookie', librarian)
      .send({ lifecycle: 'obsolete', effectiveDate: '2026-12-01', note: 'two servers alert test', version: before.version });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    try {
      const ids = using.map((d) => d.id);
      for (let i = 0; i < 200; i++) {
        const unsent = await knex('design_alerts').whereIn('design_id', ids).whereNull('sent_at').count({ n: '*' });
        if (Number(unsent[0].n) === 0) break;
        await pause(100);
      }
      // Ten more sweeps of each process: a second mail of any alert would have landed by then.
      await pause(2_000);
      const alerts = await knex('design_alerts').whereIn('design_id', [...ids, unrelated.id]);
      expect(alerts.every((a) => a.sent_at !== null)).toBe(true);
      expect(alerts.filter((a) => a.design_id === unrelated.id)).toHaveLength(0);
      for (const d of using) {
        const lifecycleAlerts = alerts.filter((a) => a.design_id === d.id && a.kind === 'lifecycle');
        expect(
          lifecycleAlerts.map((a) => a.part_id),
          `design ${d.input.name}`,
        ).toEqual([partId]);
      }
      // The ready design with the part chosen no longer holds with an obsolete switch: flagged for that too.
      expect(alerts.filter((a) => a.design_id === chosenReady.id).map((a) => a.kind)).toContain('no-longer-holds');

      const mail = await knex('captured_mail').where('id', '>', mailBefore).select('envelope_to', 'subject');
      let total = 0;
      for (const d of using) {
        const mine = alerts.filter((a) => a.design_id === d.id).length;
        const subject = `Stallpoint alert: ${d.input.name}`;
        const forDesign = mail.filter((m) => m.subject === subject);
        total += forDesign.length;
        for (const who of [demoAddress('designer'), demoAddress('buyer')])
          expect(
            forDesign.filter((m) => m.envelope_to.split(',').includes(who)),
            `${who} for ${d.input.name}`,
          ).toHaveLength(mine);
        // Nobody else got a second copy either: each recipient appears once per alert.
        const perRecipient = new Map<string, number>();
        for (const m of forDesign) for (const to of m.envelope_to.split(',')) perRecipient.set(to, (perRecipient.get(to) ?? 0) + 1);
        for (const [to, n] of perRecipient) expect(n, `${to} for ${d.input.name}`).toBe(mine);
      }
      expect(mail.filter((m) => m.subject === `Stallpoint alert: ${unrelated.input.name}`)).toHaveLength(0);
      console.log(`${alerts.length} alerts on ${using.length} designs; ${total} alert mails captured`);
    } finally {
      const now = await getPart(partId);
      await changeLifecycle(partId, before.lifecycle, now.version, 'two servers alert test: back');
    }
  }, 90_000);
});
