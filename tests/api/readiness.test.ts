/**
 * Ready means verified, always (issue 9 item 7): a catalogue change that breaks a pick of a ready design
 * sends it back to draft with the reason, and marking ready again is refused while it does not hold.
 * Expected outcomes are the sign-off rule written out by hand, not read from the code under test.
 * The demo fan design is restored afterwards; the other cases work on copies made here.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import fc from 'fast-check';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';
import type { DesignInput } from '../../src/lib/domain/design.ts';
import type { DesignMatch } from '../../src/lib/design-match.ts';
import { readinessIssues } from '../../src/lib/readiness.ts';
import { demoDesigns } from '../../db/seeds/designs.ts';
import { editParams, getDesign, getPart, lifecycle as changeLifecycle, markReady } from '../helpers/design-api.ts';

const knex = appDb();
const api = () => request(appUrl());
let designer = '';
let librarian = '';

beforeAll(async () => {
  [designer, librarian] = await Promise.all([sessionCookie('designer'), sessionCookie('librarian')]);
});
afterAll(() => knex.destroy());

const fanName = demoDesigns[1].name;
const lifecycle = (id: number, to: string, version: number) => changeLifecycle(id, to, version, 'readiness test');

/** A ready copy of the demo fan made by this file, so other test files keep their designs. */
async function readyCopy(tag: string): Promise<{ id: number; input: DesignInput }> {
  const fanId = (await knex('designs').where({ name: fanName }).first('id')).id;
  const input = { ...(await getDesign(fanId)).input, name: `Readiness ${tag} ${Date.now()}` } as DesignInput;
  const created = await api().post('/api/designs').set('Cookie', designer).send(input);
  expect(created.status).toBe(201);
  const ready = await markReady(created.body.id, created.body.version);
  expect(ready.status, JSON.stringify(ready.body)).toBe(200);
  return { id: created.body.id, input };
}

describe('obsoleting a chosen part of the ready demo fan', () => {
  it('puts the design back to draft with the reason, audits it, and refuses ready while it does not hold', async () => {
    const fan = await knex('designs').where({ name: fanName }).first();
    expect(fan.status).toBe('ready');
    const input = (await getDesign(fan.id)).input as DesignInput;
    const partId = input.selections.switch.chosenPartId as number;
    const before = await getPart(partId);
    const obsoleted = await lifecycle(partId, 'obsolete', before.version);
    expect(obsoleted.status).toBe(200);
    try {
      const design = await getDesign(fan.id);
      expect(design.status).toBe('draft');
      expect(design.statusReason).toContain(before.mpn);
      expect(design.statusReason).toMatch(/obsolete/);
      const audit = await knex('audit_events')
        .where({ entity_type: 'design', entity_id: fan.id, action: 'design.unready' })
        .orderBy('id', 'desc')
        .first();
      expect(audit?.note).toContain(before.mpn);
      const refused = await markReady(fan.id, design.version);
      expect(refused.status).toBe(409);
      const issue = refused.body.issues.find((i: { path: string }) => i.path === 'selections.switch.chosenPartId');
      expect(issue?.message).toContain(before.mpn);
    } finally {
      await lifecycle(partId, before.lifecycle, obsoleted.body.version);
      const again = await getDesign(fan.id);
      const ready = await markReady(fan.id, again.version);
      expect(ready.status, JSON.stringify(ready.body)).toBe(200);
      expect(ready.body.statusReason).toBeNull();
    }
  });
});

describe('changing a parameter of an alternate', () => {
  it('re-verifies its ready designs: a drain rating below the supply sends the design back to draft', async () => {
    const { id, input } = await readyCopy('alternate');
    const altId = input.selections.switch.alternatePartIds[0];
    expect(altId, 'the fan copy has a switch alternate').toBeTruthy();
    const original = (await getPart(altId)).params as unknown as Record<string, unknown>;
    // 12.6 V supply maximum against a 10 V drain rating: a hard fail (docs/engineering.md §5 drain-voltage check).
    const res = await editParams(altId, (p) => ({ ...p, vdsMaxV: 10 }));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    try {
      const design = await getDesign(id);
      expect(design.status).toBe('draft');
      expect(design.statusReason).toContain((await getPart(altId)).mpn);
    } finally {
      await editParams(altId, () => original);
    }
  });
});

describe('property: no design stays ready while any pick fails at the current catalogue', () => {
  it('holds after every step of random catalogue changes', async () => {
    const { id: copyId, input } = await readyCopy('property');
    const ids = [input.selections.switch.chosenPartId as number, ...input.selections.switch.alternatePartIds];
    const originals = new Map<number, { params: unknown; lifecycle: string }>();
    for (const pid of ids) {
      const p = await getPart(pid);
      originals.set(pid, { params: p.params, lifecycle: p.lifecycle });
    }
    const step = fc.record({
      part: fc.constantFrom(...ids),
      kind: fc.constantFrom('obsolete', 'nrnd', 'vds-down', 'rth-up', 'rds-up'),
      factor: fc.double({ min: 0.3, max: 3, noNaN: true }),
    });
    const restore = async () => {
      for (const [pid, o] of originals) {
        const p = await getPart(pid);
        if (p.lifecycle !== o.lifecycle) await lifecycle(pid, o.lifecycle, p.version);
        await editParams(pid, () => o.params as Record<string, unknown>);
      }
    };
    try {
      await fc.assert(
        fc.asyncProperty(fc.array(step, { minLength: 1, maxLength: 3 }), async (steps) => {
          // Each run starts from the seeded parts with the copy ready again, so every run has something at stake.
          await restore();
          const copy = await getDesign(copyId);
          if (copy.status !== 'ready') expect((await markReady(copyId, copy.version)).status).toBe(200);
          for (const s of steps) {
            const part = await getPart(s.part);
            const res =
              s.kind === 'obsolete' || s.kind === 'nrnd'
                ? await lifecycle(s.part, s.kind, part.version)
                : await editParams(s.part, (p) =>
                    s.kind === 'vds-down'
                      ? { ...p, vdsMaxV: Math.max(1, Number(p.vdsMaxV) / s.factor) }
                      : s.kind === 'rth-up'
                        ? {
                            ...p,
                            rthJaCPerW: Number(p.rthJaCPerW) * s.factor,
                            ...(Array.isArray(p.zthPoints)
                              ? {
                                  zthPoints: (p.zthPoints as { pulseS: number; zthCPerW: number }[]).map((z) => ({
                                    ...z,
                                    zthCPerW: z.zthCPerW * s.factor,
                                  })),
                                }
                              : {}),
                          }
                        : {
                            ...p,
                            rdsOn: (p.rdsOn as { maxOhm: number; typOhm: number | null }[]).map((r) => ({
                              ...r,
                              maxOhm: r.maxOhm * s.factor,
                              typOhm: r.typOhm == null ? null : r.typOhm * s.factor,
                            })),
                          },
                  );
            expect(res.status, JSON.stringify(res.body)).toBe(200);
            const ready = await knex('designs').where({ status: 'ready' }).select('id');
            for (const { id } of ready) {
              const d = await getDesign(id);
              const match = (await api().post(`/api/designs/${id}/match`).set('Cookie', designer).send({ limit: 500 })).body as DesignMatch;
              expect(readinessIssues(d.input, match), `design ${id} is ready`).toEqual([]);
            }
          }
        }),
        { numRuns: 15 },
      );
    } finally {
      await restore();
      // The demo fan shares these parts: put it back on the shortlist if a step sent it to draft.
      const fan = await knex('designs').where({ name: fanName }).first();
      if (fan.status !== 'ready') await markReady(fan.id, fan.version);
    }
  }, 240_000);
});

const agitatorName = demoDesigns[2].name;
const partIdOf = async (mpn: string): Promise<number> => (await knex('parts').where({ mpn }).first('id')).id;
const createDesign = async (input: DesignInput) => {
  const res = await api().post('/api/designs').set('Cookie', designer).send(input);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: number; version: number };
};
const issuesOf = (res: request.Response): { path: string; message: string }[] => res.body.issues ?? [];

describe('the 24 V agitator copied with a 5 V driver supply', () => {
  it('cannot be marked ready with switches characterised only at 10 V; the same picks hold at its own 12 V driver supply', async () => {
    const agitator = await knex('designs').where({ name: agitatorName }).first('id');
    const base = (await getDesign(agitator.id)).input as DesignInput;
    expect(base.driverSupplyV).toBe(12);
    expect(base.selections.driver.chosenPartId, 'the demo agitator drives its switch through a gate driver').toBeTruthy();
    // Demo standard-level parts whose only RDS(on) line is at VGS 10 V (db/seeds/data/mosfets.ts), rated 55–80 V, approved.
    const tenVoltOnly = ['TBV60N040-K', 'TBV55N018-T', 'TBV80N025-T'];
    const ids = await Promise.all(tenVoltOnly.map(partIdOf));
    for (const id of ids) expect((await getPart(id)).params).toMatchObject({ rdsOn: [expect.objectContaining({ vgsV: 10 })] });
    const selections: DesignInput['selections'] = {
      ...base.selections,
      switch: { chosenPartId: ids[0], alternatePartIds: ids.slice(1) },
      driver: { chosenPartId: base.selections.driver.chosenPartId, alternatePartIds: [] },
    };

    // Control: at 12 V the driver's output (12 V less its drop, above 10 V) is where these parts are specified.
    const control = await createDesign({ ...base, name: `Agitator 12 V driver control ${Date.now()}`, selections });
    const accepted = await markReady(control.id, control.version);
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200);
    await api().post(`/api/designs/${control.id}/status`).set('Cookie', designer).send({ status: 'draft', version: accepted.body.version });

    const copy = await createDesign({ ...base, name: `Agitator 5 V driver supply ${Date.now()}`, driverSupplyV: 5, selections });
    const match = (await api().post(`/api/designs/${copy.id}/match`).set('Cookie', designer).send({ limit: 500 })).body as DesignMatch;
    // A driver cannot put more on the gate than its own supply: at most 5 V, half the 10 V the parts are specified at.
    expect(match.switchDrive.by).toBe('driver');
    expect(match.switchDrive.gateV).toBeLessThanOrEqual(5);
    const refused = await markReady(copy.id, copy.version);
    expect(refused.status).toBe(409);
    const paths = ['selections.switch.chosenPartId', 'selections.switch.alternatePartIds.0', 'selections.switch.alternatePartIds.1'];
    paths.forEach((path, i) => {
      const issue = issuesOf(refused).find((x) => x.path === path);
      expect(issue?.message, path).toContain(tenVoltOnly[i]);
      // VGS(th) max 4 V and no RDS(on) line at or below the real drive: the gate-drive check fails, named in words.
      expect(issue?.message, path).toMatch(/fails gate drive level:/);
    });
    expect((await getDesign(copy.id)).status).toBe('draft');
  });
});

describe('an inverting driver with an internal input pull-down on a floating pin', () => {
  it('the match says the motor starts at reset; ready is refused until a start at reset is recorded as intended', async () => {
    const agitator = await knex('designs').where({ name: agitatorName }).first('id');
    const base = (await getDesign(agitator.id)).input as DesignInput;
    const template = await getPart(base.selections.driver.chosenPartId as number);
    expect(template.params, 'the hand figures below assume a fixed-threshold 1.2 V input').toMatchObject({
      inputLogic: 'fixed',
      inputHighMin: 1.2,
    });
    // Invented part: the demo agitator's driver as an inverting variant with a strong (2.2 kΩ) input pull-down,
    // so no external pull-up can rescue it. By hand (divider, VIH 1.2 V plus a 10 % of 1.8 V margin = 1.38 V):
    // against 2.2 kΩ at −30 % = 1.54 kΩ a pull-up to 1.8 V must be ≤ 1540·(1.8 − 1.38)/1.38 = 469 Ω, but the
    // pin sinks 2 mA, so it can only pull a resistor of ≥ 1.8/0.002 = 900 Ω low. The motor starts at reset.
    const created = await api()
      .post('/api/parts')
      .set('Cookie', librarian)
      .send({
        category: 'driver',
        manufacturer: template.manufacturer,
        mpn: `PLR1IL20-S6-T${Date.now().toString(36).toUpperCase()}`,
        description: 'Test part: inverting gate driver, 1.8 V input stage, strong internal input pull-down',
        package: template.package,
        params: { ...(template.params as unknown as Record<string, unknown>), inverting: true, inputPull: 'down', inputPullOhms: 2200 },
      });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body.params).toMatchObject({ inverting: true, inputPull: 'down', inputPullOhms: 2200 });
    const input: DesignInput = {
      ...base,
      name: `Inverting driver at reset ${Date.now()}`,
      logic: { ...base.logic, resetPull: 'none', resetPullOhms: 0, resetPullTolerance: 0 },
      selections: { ...base.selections, driver: { chosenPartId: created.body.id, alternatePartIds: [] } },
      resetStartIntent: null,
    };
    const design = await createDesign(input);
    const match = (await api().post(`/api/designs/${design.id}/match`).set('Cookie', designer).send({ limit: 500 })).body as DesignMatch;
    // By hand: floating pin → the driver's pull-down holds its input low → inverting → output high → gate high → motor on.
    const states = Object.fromEntries((match.powerOn?.steps ?? []).map((s) => [s.stage, s.state]));
    expect(states).toMatchObject({ pin: 'undetermined', 'pull-network': 'low', driver: 'high', gate: 'high', motor: 'on' });
    expect(match.powerOn?.motorCanStart).toBe(true);
    expect(match.powerOn?.motorStateAtReset).toBe('on');

    const refused = await markReady(design.id, design.version);
    expect(refused.status).toBe(409);
    expect(issuesOf(refused).find((x) => x.path === 'resetStartIntent')?.message).toMatch(/motor starts at power-up or reset/);

    const reason = 'Agitator must stir from power-up to keep the slurry suspended (test)';
    const saved = await api()
      .put(`/api/designs/${design.id}`)
      .set('Cookie', designer)
      .send({ version: design.version, input: { ...input, resetStartIntent: { reason } } });
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    const ready = await markReady(design.id, saved.body.version);
    expect(ready.status, JSON.stringify(ready.body)).toBe(200);
    expect(ready.body.status).toBe('ready');
    expect(ready.body.input.resetStartIntent).toEqual({ reason });
    await api().post(`/api/designs/${design.id}/status`).set('Cookie', designer).send({ status: 'draft', version: ready.body.version });
  });
});

describe('changing the RDS(on) lines of a chosen switch', () => {
  it('re-verifies its ready designs: a copy of the fan goes back to draft with the reason, and holds again once restored', async () => {
    const { id, input } = await readyCopy('rdson');
    const partId = input.selections.switch.chosenPartId as number;
    const before = await getPart(partId);
    const original = before.params as unknown as Record<string, unknown>;
    // 10 Ω on every line: at the fan's start-up current (amperes at 12.6 V) P = I²·R is tens of watts in a
    // small package, far past Tj max at any RθJA the catalogue holds (Joule’s law; docs/engineering.md §5.6).
    const res = await editParams(partId, (p) => ({
      ...p,
      rdsOn: (p.rdsOn as Record<string, unknown>[]).map((r) => ({ ...r, maxOhm: 10, typOhm: null })),
    }));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    try {
      const design = await getDesign(id);
      expect(design.status).toBe('draft');
      expect(design.statusReason).toContain(before.mpn);
      expect(design.statusReason).toMatch(/was edited/);
      // the failing checks by their readable names (src/lib/design-words.ts CHECK_LABELS, hand-copied here)
      expect(design.statusReason).toMatch(
        /junction temperature, running|junction temperature, jammed shaft|running current|stall current \(pulse rating\)/,
      );
      // The long reason (several failing checks) is kept whole on the design and clipped to fit the audit note.
      const audit = await knex('audit_events')
        .where({ entity_type: 'design', entity_id: id, action: 'design.unready' })
        .orderBy('id', 'desc')
        .first();
      expect(audit?.note).toContain(before.mpn);
      expect(JSON.parse(audit.after_json).reasons.some((r: { message: string }) => r.message.includes(before.mpn))).toBe(true);
      const refused = await markReady(id, design.version);
      expect(refused.status).toBe(409);
      expect(issuesOf(refused).find((x) => x.path === 'selections.switch.chosenPartId')?.message).toContain(before.mpn);
    } finally {
      await editParams(partId, () => original);
      const fan = await knex('designs').where({ name: fanName }).first();
      if (fan.status !== 'ready') expect((await markReady(fan.id, fan.version)).status).toBe(200);
    }
    const again = await getDesign(id);
    expect((await markReady(id, again.version)).status).toBe(200);
  });
});
