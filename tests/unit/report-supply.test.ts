/**
 * The report's supply section, read back with pdfjs-dist (an independent reader): the demo P-20 bench
 * prototype (invented) on a 0.5 A USB 2.0 port fails to start, on its own NiMH pack it passes.
 * Figures re-derived by hand: HVM-260P-060A (invented) measured R 3 Ω, 6 V, 9000 rpm, I0 0.15 A, so
 * Kt = (6 − 0.15·3)/(9000·π/30) = 5.889 mN·m/A [docs/engineering.md §2.1]; cold winding
 * R·(1 + 0.00393·(T − 20)) [IEC 60028]; port limit 0.5 A [std: USB 2.0 specification].
 */
import { describe, expect, it } from 'vitest';
import { demoDiodes, demoDrivers, demoMosfets, demoMotors } from '../../db/seeds/data/index.ts';
import { demoDesigns } from '../../db/seeds/designs.ts';
import { matchDesign } from '../../src/lib/design-match.ts';
import type { DesignInput } from '../../src/lib/domain/design.ts';
import type { Part, PartOf } from '../../src/lib/domain/parts.ts';
import { buildDesignReportPdf } from '../../src/server/reports/design-report.ts';
import { pdfPageTexts } from '../helpers/pdf-text.ts';

let nextId = 1;
const withIds = <P extends Omit<Part, 'id' | 'version'>>(parts: P[]): (P & { id: number; version: number })[] =>
  parts.map((p) => ({ ...p, id: nextId++, version: 1 }));
const motors = withIds(demoMotors) as PartOf<'motor'>[];
const catalogue = {
  mosfets: withIds(demoMosfets) as PartOf<'mosfet'>[],
  drivers: withIds(demoDrivers) as PartOf<'driver'>[],
  diodes: withIds(demoDiodes) as PartOf<'diode'>[],
  excluded: { switch: 0, driver: 0, diode: 0 },
};
const motor = motors.find((m) => m.mpn === 'HVM-260P-060A')!;
const noSelections: DesignInput['selections'] = {
  switch: { chosenPartId: null, alternatePartIds: [] },
  driver: { chosenPartId: null, alternatePartIds: [] },
  diode: { chosenPartId: null, alternatePartIds: [] },
};
const demo = demoDesigns.find((d) => d.name.startsWith('P-20 bench prototype'))!;
const { motorMpn: _m, ready: _r, laterRevisions = [], ...rev1Fields } = demo;
const rev1: DesignInput = { ...rev1Fields, motor: { source: 'catalogue', partId: motor.id as number }, selections: noSelections };
const rev2: DesignInput = { ...rev1, ...laterRevisions[0] };

async function supplySection(input: DesignInput, revision: number): Promise<string> {
  const match = matchDesign(input, motor.mpn, motor.params, catalogue);
  const design = {
    id: 4,
    name: input.name,
    revision,
    ownerName: 'Dana Example',
    status: 'draft' as const,
    generatedAt: new Date('2026-03-02T09:30:00Z'),
  };
  const bytes = await buildDesignReportPdf({ design, input, match, bom: [], partsById: new Map() }, { standardFonts: false });
  const text = (await pdfPageTexts(bytes)).join(' ');
  const start = text.indexOf('Supply and logic at start');
  expect(start).toBeGreaterThan(text.indexOf('Motor model')); // after the motor section
  const end = text.indexOf('Worst case', start);
  expect(end).toBeGreaterThan(start); // before the worst case and the switch
  return text.slice(start, end);
}

describe('report: supply and logic at start', () => {
  it('rev 1 on the USB 2.0 port: checks with values, limits and verdict words; never starts; the controller browns out', async () => {
    const s = await supplySection(rev1, 1);
    expect(s).toContain('limits at 500 mA');
    expect(s).toContain('Start current against the source');
    // verdict words: "✕ fail" when the font has the marks, else "FAIL" (never colour alone)
    expect(s).toMatch(/✕ fail|FAIL/);
    // 5.25 V/(3·(1 + 0.00393·(15 − 20)) + 0.15 Ω) = 1.698 A asked for; held at 0.5 A
    expect(s).toContain('1.7 A asked for'); // three significant digits, trailing zero dropped (units.ts measure)
    expect(s).toContain('held at its limit');
    // start torque Kt·(0.5 − 0.15) = 5.889e-3·0.35 = 2.06 mN·m
    expect(s).toContain('2.06 mN·m');
    // shared rail: 0.5 A·(2.941 + 0.15) Ω = 1.55 V against 3.0 V + 0.3 V dropout
    expect(s).toContain('1.55 V');
    expect(s).toContain('1.55 V >= 3.3 V');
    expect(s).toMatch(/separate|supply of its own/);
    expect(s).toContain('Caution: Every start draws up to 1.7 A');
  });

  it('rev 2 on its own 4 × NiMH pack with the controller separate: pass, no brown-out check', async () => {
    const s = await supplySection(rev2, 2);
    expect(s).toMatch(/internal resistance 120 m\s*Ω/); // 4 × 0.03 Ω per NiMH cell (from memory)
    expect(s).toContain('on a supply of its own');
    expect(s).toMatch(/Verdict\s+(✓ pass|PASS)/);
    expect(s).not.toContain('brown-out)');
    expect(s).not.toMatch(/✕ fail|FAIL/);
  });
});
