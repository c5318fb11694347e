/**
 * Report section after the motor: the supply and the logic at start [docs/engineering.md §3] — the source
 * as entered, every supply check with value, limit and verdict in words, the start figures, the
 * ride-through capacitor and the notes that say what to change.
 */
import type { DesignInput } from '../../lib/domain/design.ts';
import type { SupplyReport } from '../../lib/supply.ts';
import { bulkCapacitanceView, checkVerdict, limitRelation, torqueText } from '../../lib/supply-view.ts';
import { checkLabel } from '../../lib/design-words.ts';
import { quantity, sig, verdictText } from './report-format.ts';
import { MUTED, type ReportLayout } from './report-layout.ts';
import { drawTable, type TableColumn } from './report-table.ts';

const SUPPLY_CHECK_COLUMNS: readonly TableColumn[] = [
  { title: 'Check', widthFraction: 0.2 },
  { title: 'Value', widthFraction: 0.1, align: 'right' },
  { title: 'Limit', widthFraction: 0.12, align: 'right' },
  { title: 'Verdict', widthFraction: 0.1 },
  { title: 'Note', widthFraction: 0.48 },
];

/** The report's font has no warning sign: a note's "⚠" reads as a word there. */
const printable = (note: string): string => note.replace(/⚠\s*/g, 'Caution: ');

function sourceText(s: DesignInput['supply']): string {
  const parts = [
    `internal resistance ${quantity(s.internalResistanceOhm, 'Ω')}`,
    s.continuousCurrentA == null ? 'continuous rating not stated' : `continuous rating ${quantity(s.continuousCurrentA, 'A')}`,
    s.currentLimitA == null ? 'no current limit' : `limits at ${quantity(s.currentLimitA, 'A')}`,
  ];
  return `${parts.join(', ')}${s.preset ? ` (preset ${s.preset})` : ''}`;
}

function controllerText(logic: DesignInput['logic']): string {
  const shared = logic.sharedSupply;
  if (!shared) return 'on a supply of its own (no brown-out check)';
  const regulator =
    shared.regulatorDropoutV > 0 ? ` behind a regulator with ${quantity(shared.regulatorDropoutV, 'V')} dropout` : ', fed directly';
  return `on the motor's source${regulator}; keeps running down to ${quantity(shared.minSupplyV, 'V')}`;
}

export function drawSupply(layout: ReportLayout, input: DesignInput, supply: SupplyReport | null, verdictMarks: boolean): void {
  layout.heading('Supply and logic at start', 120);
  if (supply == null) {
    layout.paragraph('Not judged: the supply report could not be made for these inputs.', { bold: true });
    return;
  }
  layout.keyValues([
    ['Source', sourceText(input.supply)],
    ['Controller', controllerText(input.logic)],
    ['Verdict', verdictText(supply.verdict, verdictMarks)],
  ]);
  layout.gap(4);
  drawTable(
    layout,
    SUPPLY_CHECK_COLUMNS,
    supply.checks.map((c) => [
      checkLabel(c.id),
      quantity(c.value, c.unit),
      `${limitRelation(c.id)} ${quantity(c.limit, c.unit)}`,
      verdictText(checkVerdict(c), verdictMarks),
      printable(c.note),
    ]),
  );
  layout.gap(4);
  const bulk = bulkCapacitanceView(supply.bulkCapacitanceF);
  const limited = supply.startActualCurrentA < supply.startCurrentA;
  layout.keyValues([
    [
      'Start current',
      `${quantity(supply.startCurrentA, 'A')} asked for at the highest supply, winding at ${sig(input.ambientMinC)} ` +
        `°C; the source delivers ${quantity(supply.startActualCurrentA, 'A')}${limited ? ' (held at its limit)' : ''}`,
    ],
    ['Source at start', `${quantity(supply.sourceVoltageAtStartV, 'V')} at the terminals at the lowest supply`],
    ['Start torque', `${torqueText(supply.startTorqueNm)} at the lowest supply, winding at ${sig(input.ambientMaxC)} °C`],
    ['Running current', quantity(supply.runningCurrentA, 'A')],
    ['Bulk capacitance', bulk == null ? 'no figure (see the notes)' : bulk.practical ? bulk.text : `${bulk.text}: not practical`],
  ]);
  layout.gap(3);
  supply.notes.forEach((n) => layout.bullet(printable(n), { sizePt: 8.5, color: MUTED }));
}
