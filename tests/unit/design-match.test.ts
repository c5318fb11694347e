import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { demoDiodes, demoDrivers, demoMosfets, demoMotors } from '../../db/seeds/data/index.ts';
import { demoDesigns } from '../../db/seeds/designs.ts';
import { matchDesign, suggestSelections, type MatchCatalogue } from '../../src/lib/design-match.ts';
import { buildBom, bomToCsv } from '../../src/lib/bom.ts';
import { designInputSchema } from '../../src/lib/schemas/design.ts';
import type { DesignInput } from '../../src/lib/domain/design.ts';
import type { Part, PartOf } from '../../src/lib/domain/parts.ts';

let nextId = 1;
const withIds = <T extends object>(list: readonly T[]): (T & { id: number; version: number })[] =>
  list.map((p) => ({ ...p, id: nextId++, version: 1 }));
const mosfets = withIds(demoMosfets) as PartOf<'mosfet'>[];
const drivers = withIds(demoDrivers) as PartOf<'driver'>[];
const diodes = withIds(demoDiodes) as PartOf<'diode'>[];
const none = { chosenPartId: null, alternatePartIds: [] };

function inputFor(name: string): { input: DesignInput; motor: (typeof demoMotors)[number] } {
  const demo = demoDesigns.find((d) => d.name.startsWith(name))!;
  const { motorMpn, ready: _ready, ...rest } = demo;
  const motor = demoMotors.find((m) => m.mpn === motorMpn)!;
  return { input: { ...rest, motor: { source: 'catalogue', partId: 1 }, selections: { switch: none, driver: none, diode: none } }, motor };
}

const catalogue = (m: PartOf<'mosfet'>[]): MatchCatalogue => ({
  mosfets: m,
  drivers,
  diodes,
  excluded: { switch: 0, driver: 0, diode: 0 },
});

describe('design matching (invented demo catalogue)', () => {
  it('common practice: 3.3 V logic with only standard-level switches (RDS(on) given at 10 V) needs a driver of 5 V or more', () => {
    const { input, motor } = inputFor('BF-12');
    const standard = mosfets.filter((m) => m.params.channel === 'n' && Math.min(...m.params.rdsOn.map((p) => p.vgsV)) >= 10);
    expect(standard.length).toBeGreaterThan(0);
    const match = matchDesign(input, motor.mpn, motor.params, catalogue(standard));
    expect(match.switch.every((s) => s.verdict === 'fail')).toBe(true);
    expect(match.switch.every((s) => s.checks.find((c) => c.id === 'gate-drive')?.ok === false)).toBe(true);
    expect(match.driverNeeded).toBe(true);
    expect(match.requiredGateDriveV).toBeGreaterThanOrEqual(5);
    expect(match.driverNeededNote).toMatch(/driver with a \d+(\.\d+)? V or higher output/);
    expect(match.driver.length).toBeGreaterThan(0);
  });

  it('suggests only passing parts, at most three alternates, never the chosen one twice', () => {
    const { input, motor } = inputFor('P-20');
    const match = matchDesign(input, motor.mpn, motor.params, catalogue(mosfets.filter((m) => m.params.channel === 'n')));
    const sel = suggestSelections(match);
    for (const role of ['switch', 'diode'] as const) {
      const list = role === 'switch' ? match.switch : match.diode;
      const ids = [sel[role].chosenPartId, ...sel[role].alternatePartIds];
      expect(sel[role].alternatePartIds.length).toBeLessThanOrEqual(3);
      expect(new Set(ids).size).toBe(ids.length);
      for (const id of ids) expect(list.find((e) => e.partId === id)?.verdict).toBe('pass');
    }
  });
});

describe('bill of materials', () => {
  it('lists motor, switch and diode with designators and alternates, and survives a papaparse round trip', () => {
    const { input, motor } = inputFor('P-20');
    const match = matchDesign(input, motor.mpn, motor.params, catalogue(mosfets.filter((m) => m.params.channel === 'n')));
    const withSel = { ...input, selections: suggestSelections(match) };
    const partsById = new Map<number, Part>([...mosfets, ...diodes, ...drivers].map((p) => [p.id as number, p]));
    const lines = buildBom({
      input: withSel,
      motor: { manufacturer: motor.manufacturer, mpn: motor.mpn, description: motor.description },
      partsById,
      pull: match.powerOn?.recommendedPull ?? null,
    });
    expect(lines.map((l) => l.referenceDesignators)).toEqual(expect.arrayContaining(['M1', 'Q1', 'D1']));
    expect(lines.every((l) => l.quantity === input.boardQuantity)).toBe(true);
    const parsed = Papa.parse<Record<string, string>>(bomToCsv(lines), { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data).toHaveLength(lines.length);
    expect(parsed.data.map((r) => r['Part number'])).toEqual(lines.map((l) => l.partNumber));
    expect(parsed.data.find((r) => r['Reference designators'] === 'Q1')?.Alternates.split('; ')).toHaveLength(
      withSel.selections.switch.alternatePartIds.length,
    );
  });

  it('carries the pairing notes in their own column, on the switch line only when no driver is chosen', () => {
    const { input, motor } = inputFor('P-20');
    const match = matchDesign(input, motor.mpn, motor.params, catalogue(mosfets.filter((m) => m.params.channel === 'n')));
    const withSel = { ...input, selections: suggestSelections(match) };
    const partsById = new Map<number, Part>([...mosfets, ...diodes, ...drivers].map((p) => [p.id as number, p]));
    const lines = buildBom({
      input: withSel,
      motor: { manufacturer: motor.manufacturer, mpn: motor.mpn, description: motor.description },
      partsById,
      pull: null,
      pairing: { switch: 'judged at 2.9 V gate drive from the controller pin' },
    });
    const parsed = Papa.parse<Record<string, string>>(bomToCsv(lines), { header: true, skipEmptyLines: true });
    expect(parsed.meta.fields).toEqual([
      'Line',
      'Role',
      'Quantity',
      'Manufacturer',
      'Part number',
      'Description',
      'Alternates',
      'Reference designators',
      'Judged at / paired with',
      'Status at current catalogue',
    ]);
    const byRef = Object.fromEntries(parsed.data.map((r) => [r['Reference designators'], r['Judged at / paired with']]));
    expect(byRef).toMatchObject({ M1: '', Q1: 'judged at 2.9 V gate drive from the controller pin', D1: '' });
  });
});

describe.each([
  ['supply out of order', (i: DesignInput) => ({ ...i, supply: { ...i.supply, minV: 9, nomV: 5 } }), 'supply.nomV'],
  ['duty above 1', (i: DesignInput) => ({ ...i, drive: { mode: 'pwm', frequencyHz: 20000, dutyMin: 0.2, dutyMax: 1.2 } }), 'drive.dutyMax'],
  ['ambient reversed', (i: DesignInput) => ({ ...i, ambientMinC: 60, ambientMaxC: 20 }), 'ambientMinC'],
  ['logic high above rail', (i: DesignInput) => ({ ...i, logic: { ...i.logic, highV: 4 } }), 'logic.highV'],
  [
    'four alternates',
    (i: DesignInput) => ({ ...i, selections: { ...i.selections, switch: { chosenPartId: 1, alternatePartIds: [2, 3, 4, 5] } } }),
    'selections.switch.alternatePartIds',
  ],
  ['negative wiring', (i: DesignInput) => ({ ...i, wiringResistanceOhm: -1 }), 'wiringResistanceOhm'],
])('design input schema: %s', (_name, mutate, path) => {
  it(`names ${path}`, () => {
    const { input } = inputFor('BF-12');
    const r = designInputSchema.safeParse(mutate(input));
    expect(r.success).toBe(false);
    if (!r.success) expect(r.error.issues.map((x) => x.path.join('.'))).toContain(path);
  });
});
