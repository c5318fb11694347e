/**
 * Three demo designs of the invented Kestrel Fluidics scenario, owned by the demo designer. Their part
 * selections are not hard-coded: the seed ranks the demo catalogue with the engineering core and picks the
 * best passing part per line plus up to three passing alternates, as the workspace would suggest.
 */
import type { Knex } from 'knex';
import type { DesignInput } from '../../src/lib/domain/design.ts';
import { DEFAULT_DESIGN_MARGINS } from '../../src/lib/domain/design.ts';
import { matchDesign, suggestSelections } from '../../src/lib/design-match.ts';
import { loadCandidates } from '../../src/server/services/design-candidates.ts';
import { hydrateParts } from '../../src/server/repos/parts.ts';
import { insertRevision, replaceDesignParts } from '../../src/server/repos/designs.ts';
import type { DbPartRow } from '../../src/server/repos/part-rows.ts';

const noSelections = (): DesignInput['selections'] => ({
  switch: { chosenPartId: null, alternatePartIds: [] },
  driver: { chosenPartId: null, alternatePartIds: [] },
  diode: { chosenPartId: null, alternatePartIds: [] },
});

type DemoDesign = Omit<DesignInput, 'motor' | 'selections'> & { motorMpn: string; ready?: boolean };

export const demoDesigns: DemoDesign[] = [
  {
    name: 'P-20 dosing pump, 4 × NiMH, PWM',
    motorMpn: 'HVM-260P-060A',
    supply: { minV: 4.0, nomV: 4.8, maxV: 5.8, preset: '4xAA-nimh', internalResistanceOhm: 0, continuousCurrentA: null, currentLimitA: null },
    wiringResistanceOhm: 0.05,
    shuntResistanceOhm: 0.1,
    logic: { railV: 3.3, highV: 2.9, lowV: 0.4, pinSourceCurrentA: 0.008, pinSinkCurrentA: 0.008, resetPull: 'none', resetPullOhms: 0, resetPullTolerance: 0, sharedSupply: null },
    drive: { mode: 'pwm', frequencyHz: 20_000, dutyMin: 0.3, dutyMax: 0.95 },
    ambientMinC: 5,
    ambientMaxC: 40,
    load: { kind: 'torque', torqueNm: 0.003 },
    margins: { ...DEFAULT_DESIGN_MARGINS },
    driverSupplyV: null,
    boardQuantity: 250,
    stallProtection: { kind: 'none' },
    resetStartIntent: null,
  },
  {
    name: 'BF-12 bench fan, 12 V, on/off from 3.3 V logic',
    motorMpn: 'BRM2430-120C',
    supply: { minV: 11.4, nomV: 12, maxV: 12.6, preset: 'bench-12v', internalResistanceOhm: 0, continuousCurrentA: null, currentLimitA: null },
    wiringResistanceOhm: 0.1,
    shuntResistanceOhm: 0,
    logic: { railV: 3.3, highV: 2.9, lowV: 0.4, pinSourceCurrentA: 0.004, pinSinkCurrentA: 0.004, resetPull: 'up', resetPullOhms: 40_000, resetPullTolerance: 0.3, sharedSupply: null },
    drive: { mode: 'onoff' },
    ambientMinC: 10,
    ambientMaxC: 45,
    load: { kind: 'speed', speedRpm: 4800 },
    margins: { ...DEFAULT_DESIGN_MARGINS },
    driverSupplyV: null,
    boardQuantity: 500,
    stallProtection: { kind: 'none' },
    resetStartIntent: null,
    ready: true,
  },
  {
    name: 'AG-3 agitator, 24 V, 1.8 V logic through a gate driver',
    motorMpn: 'BRM3242-240A',
    supply: { minV: 22.8, nomV: 24, maxV: 25.2, preset: 'bench-24v', internalResistanceOhm: 0, continuousCurrentA: null, currentLimitA: null },
    wiringResistanceOhm: 0.15,
    shuntResistanceOhm: 0,
    logic: { railV: 1.8, highV: 1.35, lowV: 0.45, pinSourceCurrentA: 0.002, pinSinkCurrentA: 0.002, resetPull: 'down', resetPullOhms: 50_000, resetPullTolerance: 0.3, sharedSupply: null },
    drive: { mode: 'pwm', frequencyHz: 18_000, dutyMin: 0.2, dutyMax: 0.8 },
    ambientMinC: 15,
    ambientMaxC: 50,
    load: { kind: 'torque', torqueNm: 0.02 },
    margins: { ...DEFAULT_DESIGN_MARGINS },
    driverSupplyV: 12,
    boardQuantity: 100,
    stallProtection: { kind: 'none' },
    resetStartIntent: null,
  },
];

async function motorPart(knex: Knex, mpn: string) {
  const rows: DbPartRow[] = await knex('parts').where({ category: 'motor', mpn });
  const [part] = await hydrateParts(knex, rows);
  if (!part || part.category !== 'motor') throw new Error(`demo motor ${mpn} is missing from the catalogue`);
  return part;
}

export async function seedDesigns(knex: Knex, ownerId: number): Promise<number> {
  let added = 0;
  for (const demo of demoDesigns) {
    if (await knex('designs').where({ owner_id: ownerId, name: demo.name }).first()) continue;
    const { motorMpn, ready, ...rest } = demo;
    const motor = await motorPart(knex, motorMpn);
    const draft: DesignInput = { ...rest, motor: { source: 'catalogue', partId: motor.id as number }, selections: noSelections() };
    const match = matchDesign(draft, motor.mpn, motor.params, await loadCandidates(knex, draft, motor.params, false));
    const input: DesignInput = { ...draft, selections: suggestSelections(match) };
    await knex.transaction(async (trx) => {
      const [id] = await trx('designs').insert({
        owner_id: ownerId, name: input.name, current_revision: 1,
        status: ready ? 'ready' : 'draft', ready_at: ready ? trx.fn.now(3) : null,
      });
      await insertRevision(trx, id, 1, input, ownerId);
      await replaceDesignParts(trx, id, input);
    });
    added += 1;
  }
  return added;
}
