/**
 * Four demo designs of the invented Kestrel Fluidics scenario (the fourth in two revisions), owned by the demo designer. Their part
 * selections are not hard-coded: the seed ranks the demo catalogue with the engineering core and picks the
 * best passing part per line plus up to three passing alternates, as the workspace would suggest.
 */
import type { Knex } from 'knex';
import type { DesignInput } from '../../src/lib/domain/design.ts';
import { DEFAULT_DESIGN_MARGINS } from '../../src/lib/domain/design.ts';
import { matchDesign, suggestSelections, prepareCase } from '../../src/lib/design-match.ts';
import { loadCandidates } from '../../src/server/services/design-candidates.ts';
import { hydrateParts } from '../../src/server/repos/parts.ts';
import { insertRevision, replaceDesignParts } from '../../src/server/repos/designs.ts';
import type { DbPartRow } from '../../src/server/repos/part-rows.ts';

const noSelections = (): DesignInput['selections'] => ({
  switch: { chosenPartId: null, alternatePartIds: [] },
  driver: { chosenPartId: null, alternatePartIds: [] },
  diode: { chosenPartId: null, alternatePartIds: [] },
});

type DemoInput = Omit<DesignInput, 'motor' | 'selections'>;

/** A demo design; `laterRevisions` are saved after the first, each as a change to the one before. */
type DemoDesign = DemoInput & { motorMpn: string; ready?: boolean; laterRevisions?: Partial<DemoInput>[] };

/**
 * The USB bench prototype of the P-20 pump (HVM-260P-060A: 3 Ω, I0 0.15 A, Kt 5.89 mN·m/A, 3 mN·m load).
 * Rev 1 on a 0.5 A USB 2.0 port: the motor asks for 1.70 A (5.25 V, winding at 15 °C), the port holds
 * 0.5 A, so the start torque is Kt·(0.5 − 0.15) = 2.06 mN·m < 3 mN·m: it never starts; the controller on the
 * same port (3.0 V minimum behind a 0.3 V-dropout regulator) sees 0.5 A × 3.09 Ω = 1.55 V: brown-out.
 * Rev 2 gives the motor its own 4 × AA NiMH pack (0.12 Ω) and the controller its own USB feed: all pass.
 */
const USB_PROTOTYPE: DemoDesign = {
  name: 'P-20 bench prototype: from USB power to its own pack',
  motorMpn: 'HVM-260P-060A',
  supply: { minV: 4.75, nomV: 5.0, maxV: 5.25, preset: 'usb2-port', internalResistanceOhm: 0, continuousCurrentA: 0.5, currentLimitA: 0.5 },
  wiringResistanceOhm: 0.15,
  shuntResistanceOhm: 0,
  logic: {
    railV: 3.3,
    highV: 2.9,
    lowV: 0.4,
    pinSourceCurrentA: 0.008,
    pinSinkCurrentA: 0.008,
    resetPull: 'none',
    resetPullOhms: 0,
    resetPullTolerance: 0,
    sharedSupply: { minSupplyV: 3.0, regulatorDropoutV: 0.3 },
  },
  drive: { mode: 'pwm', frequencyHz: 20_000, dutyMin: 0.3, dutyMax: 0.95 },
  ambientMinC: 15,
  ambientMaxC: 35,
  load: { kind: 'torque', torqueNm: 0.003 },
  margins: { ...DEFAULT_DESIGN_MARGINS },
  driverSupplyV: null,
  boardQuantity: 5,
  stallProtection: { kind: 'none' },
  resetStartIntent: null,
  laterRevisions: [
    {
      supply: {
        minV: 4.0,
        nomV: 4.8,
        maxV: 5.8,
        preset: '4xAA-nimh',
        internalResistanceOhm: 0.12,
        continuousCurrentA: 2.0,
        currentLimitA: null,
      },
      wiringResistanceOhm: 0.05,
      logic: {
        railV: 3.3,
        highV: 2.9,
        lowV: 0.4,
        pinSourceCurrentA: 0.008,
        pinSinkCurrentA: 0.008,
        resetPull: 'none',
        resetPullOhms: 0,
        resetPullTolerance: 0,
        sharedSupply: null,
      },
    },
  ],
};

export const demoDesigns: DemoDesign[] = [
  {
    name: 'P-20 dosing pump, 4 × NiMH, PWM',
    motorMpn: 'HVM-260P-060A',
    supply: {
      minV: 4.0,
      nomV: 4.8,
      maxV: 5.8,
      preset: '4xAA-nimh',
      internalResistanceOhm: 0,
      continuousCurrentA: null,
      currentLimitA: null,
    },
    wiringResistanceOhm: 0.05,
    shuntResistanceOhm: 0.1,
    logic: {
      railV: 3.3,
      highV: 2.9,
      lowV: 0.4,
      pinSourceCurrentA: 0.008,
      pinSinkCurrentA: 0.008,
      resetPull: 'none',
      resetPullOhms: 0,
      resetPullTolerance: 0,
      sharedSupply: null,
    },
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
    supply: {
      minV: 11.4,
      nomV: 12,
      maxV: 12.6,
      preset: 'bench-12v',
      internalResistanceOhm: 0,
      continuousCurrentA: null,
      currentLimitA: null,
    },
    wiringResistanceOhm: 0.1,
    shuntResistanceOhm: 0,
    logic: {
      railV: 3.3,
      highV: 2.9,
      lowV: 0.4,
      pinSourceCurrentA: 0.004,
      pinSinkCurrentA: 0.004,
      resetPull: 'up',
      resetPullOhms: 40_000,
      resetPullTolerance: 0.3,
      sharedSupply: null,
    },
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
    supply: {
      minV: 22.8,
      nomV: 24,
      maxV: 25.2,
      preset: 'bench-24v',
      internalResistanceOhm: 0,
      continuousCurrentA: null,
      currentLimitA: null,
    },
    wiringResistanceOhm: 0.15,
    shuntResistanceOhm: 0,
    logic: {
      railV: 1.8,
      highV: 1.35,
      lowV: 0.45,
      pinSourceCurrentA: 0.002,
      pinSinkCurrentA: 0.002,
      resetPull: 'down',
      resetPullOhms: 50_000,
      resetPullTolerance: 0.3,
      sharedSupply: null,
    },
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
  USB_PROTOTYPE,
];

async function motorPart(knex: Knex, mpn: string) {
  const rows: DbPartRow[] = await knex('parts').where({ category: 'motor', mpn });
  const [part] = await hydrateParts(knex, rows);
  if (!part || part.category !== 'motor') throw new Error(`demo motor ${mpn} is missing from the catalogue`);
  return part;
}

/** Ranks the catalogue for one revision and takes the suggested picks, as the workspace would. */
async function withSuggestedPicks(knex: Knex, rest: DemoInput, motor: Awaited<ReturnType<typeof motorPart>>): Promise<DesignInput> {
  const draft: DesignInput = { ...rest, motor: { source: 'catalogue', partId: motor.id as number }, selections: noSelections() };
  const catalogue = await loadCandidates(knex, prepareCase(draft, motor.params), false);
  // Picks change what the others are judged at (a chosen driver sets the switch's drive), so settle them.
  let input = draft;
  for (let round = 0; round < 4; round += 1) {
    const selections = suggestSelections(matchDesign(input, motor.mpn, motor.params, catalogue));
    if (JSON.stringify(selections) === JSON.stringify(input.selections)) break;
    input = { ...input, selections };
  }
  return input;
}

/** Idempotent: a design already there (same owner and name) is left alone. */
export async function seedDesigns(knex: Knex, ownerId: number): Promise<number> {
  let added = 0;
  for (const demo of demoDesigns) {
    const { motorMpn, ready, laterRevisions = [], ...first } = demo;
    if (await knex('designs').where({ owner_id: ownerId, name: first.name }).first()) continue;
    const motor = await motorPart(knex, motorMpn);
    const inputs: DesignInput[] = [await withSuggestedPicks(knex, first, motor)];
    let previous: DemoInput = first;
    for (const patch of laterRevisions) {
      previous = { ...previous, ...patch };
      inputs.push(await withSuggestedPicks(knex, previous, motor));
    }
    const current = inputs[inputs.length - 1];
    await knex.transaction(async (trx) => {
      const [id] = await trx('designs').insert({
        owner_id: ownerId,
        name: current.name,
        current_revision: inputs.length,
        status: ready ? 'ready' : 'draft',
        ready_at: ready ? trx.fn.now(3) : null,
      });
      for (const [i, input] of inputs.entries()) await insertRevision(trx, id, i + 1, input, ownerId);
      await replaceDesignParts(trx, id, current);
    });
    added += 1;
  }
  return added;
}
