/** Report sections 6–9: power-on state, bill of materials, assumptions, cautions and the closing deferral. */
import type { BomLine } from '../../lib/bom.ts';
import type { DesignMatch } from '../../lib/design-match.ts';
import { COPPER_ALPHA20_PER_K } from '../../lib/motor.ts';
import type { PowerOnStep } from '../../lib/power-on.ts';
import { motorStateText } from '../../lib/design-words.ts';
import { motorStateAtReset } from '../../lib/readiness.ts';
import { DEFAULT_RDSON_TEMPCO_PER_C } from '../../lib/rdson.ts';
import { CAUTIONS } from '../../lib/safety-notes.ts';
import { percent, quantity, sig } from './report-format.ts';
import { MUTED, type ReportLayout } from './report-layout.ts';
import { drawTable, type TableColumn } from './report-table.ts';

/** The report's last line: the design is an aid, not a sign-off. */
export const DEFERRAL_LINE =
  'This report is an engineering aid, not an approval. Follow local codes and regulations, and have a ' +
  'qualified engineer review the design against the parts\u2019 own datasheets before it is built or used.';

const POWER_ON_COLUMNS: readonly TableColumn[] = [
  { title: 'Stage', widthFraction: 0.14 },
  { title: 'State', widthFraction: 0.13 },
  { title: 'Voltage', widthFraction: 0.13, align: 'right' },
  { title: 'Note', widthFraction: 0.6 },
];

const BOM_TABLE_COLUMNS: readonly (TableColumn & { key: keyof BomLine })[] = [
  { key: 'line', title: 'Line', widthFraction: 0.05, align: 'right' },
  { key: 'role', title: 'Role', widthFraction: 0.14 },
  { key: 'quantity', title: 'Qty', widthFraction: 0.06, align: 'right' },
  { key: 'manufacturer', title: 'Manufacturer', widthFraction: 0.13 },
  { key: 'partNumber', title: 'Part number', widthFraction: 0.13 },
  { key: 'description', title: 'Description', widthFraction: 0.15 },
  { key: 'alternates', title: 'Alternates', widthFraction: 0.14 },
  { key: 'referenceDesignators', title: 'Ref.', widthFraction: 0.07 },
  { key: 'status', title: 'Status now', widthFraction: 0.13 },
];

const STAGE_NAMES: Readonly<Record<PowerOnStep['stage'], string>> = {
  pin: 'Controller pin',
  'pull-network': 'Pull network',
  driver: 'Driver',
  gate: 'Gate',
  motor: 'Motor',
};

function stepVoltage(step: PowerOnStep): string {
  if (step.minV == null || step.maxV == null) return '—';
  return step.minV === step.maxV ? quantity(step.minV, 'V') : `${sig(step.minV)}–${sig(step.maxV)} V`;
}

/**
 * `acceptedResetStart`: the recorded reason when the motor may run at reset (readiness accepts it);
 * `recordedIntent`: the reason as recorded in the design, printed even when the motor stays off.
 */
export function drawPowerOn(
  layout: ReportLayout,
  match: DesignMatch,
  acceptedResetStart: string | null = null,
  recordedIntent: string | null = null,
): void {
  layout.heading('Power-on state');
  const p = match.powerOn;
  if (p == null) {
    layout.paragraph('Not walked: no switch could be chosen, so the reset state of the gate is unknown.', { bold: true });
    return;
  }
  drawTable(
    layout,
    POWER_ON_COLUMNS,
    p.steps.map((s) => [STAGE_NAMES[s.stage], s.state, stepVoltage(s), s.note]),
  );
  layout.paragraph(
    p.motorCanStart ? `The motor CAN start at power-on or reset. ${p.note}` : `The motor stays off through power-on and reset. ${p.note}`,
    { bold: true },
  );
  const pull = p.recommendedPull;
  layout.gap(3);
  if (pull == null)
    layout.paragraph(
      p.motorCanStart
        ? 'Recommended pull resistor: none keeps the motor off; see the note above for what to change.'
        : 'Recommended pull resistor: none needed.',
      { bold: p.motorCanStart },
    );
  else if (pull.ok && pull.chosenOhms != null) {
    const node = pull.nodeV == null ? '' : `; the node then sits at ${quantity(pull.nodeV, 'V')}`;
    const current =
      pull.activeCurrentA == null ? '' : `, and the pin carries ${quantity(pull.activeCurrentA, 'A')} when it drives the other level`;
    const to = pull.to === 'down' ? 'pull-down to ground' : `pull-up to ${sig(pull.railV)} V`;
    layout.paragraph(
      `Recommended pull resistor: ${quantity(pull.chosenOhms, 'Ω')} ${to} (allowed ${quantity(pull.minOhms, 'Ω')} to ${quantity(pull.maxOhms, 'Ω')})${node}${current}.`,
    );
  } else layout.paragraph('Recommended pull resistor: no standard value fits; see the notes below.', { bold: true });
  pull?.notes.forEach((n) => layout.paragraph(n, { sizePt: 8.5, color: MUTED, indentPt: 10 }));
  const state = motorStateAtReset(p);
  const fitted = pull != null && pull.ok && pull.chosenOhms != null && p.withRecommendedPull != null;
  if (state)
    layout.paragraph(`Motor at reset as built${fitted ? ' (with the recommended pull fitted)' : ''}: ${motorStateText(state)}.`, {
      bold: true,
    });
  if (acceptedResetStart)
    layout.paragraph(
      `Start at reset recorded as intended by the designer: “${acceptedResetStart}”. Guard the moving parts and verify on the real board.`,
      { bold: true },
    );
  else if (recordedIntent)
    layout.paragraph(
      `The designer recorded a start at reset as intended (“${recordedIntent}”); not needed now, since the motor stays off at reset.`,
    );
}

export function drawBom(layout: ReportLayout, bom: readonly BomLine[]): void {
  layout.heading('Bill of materials');
  if (bom.length === 0) {
    layout.paragraph('No parts chosen yet: the bill of materials is empty.');
    return;
  }
  drawTable(
    layout,
    BOM_TABLE_COLUMNS,
    bom.map((line) => BOM_TABLE_COLUMNS.map((c) => String(line[c.key]))),
    { sizePt: 7.5 },
  );
}

const ASSUMPTIONS: readonly string[] = [
  'Junction temperatures use the junction-to-ambient thermal resistance (RθJA) from each datasheet, which is measured ' +
    'on a standard JEDEC-style test board. Your board, its copper area and its enclosure will run hotter or cooler.',
  `RDS(on) rises with junction temperature by ${percent(DEFAULT_RDSON_TEMPCO_PER_C, 1)} per kelvin from its 25 °C ` +
    `value unless a part states otherwise; between the gate voltages a datasheet lists, RDS(on) is interpolated.`,
  `The winding resistance is taken at 20 °C and scaled with copper's ${percent(COPPER_ALPHA20_PER_K, 3)} per kelvin; the start-up (stall) current uses the coldest ambient and the highest supply.`,
  'The motor follows the linear DC model: constant winding resistance, Ke = Kt and a constant friction torque; brush drop, saturation and heating while running are ignored.',
  'PWM currents include the ripple when the motor’s inductance is known (continuous or discontinuous conduction, docs/engineering.md §4.2–§4.3) ' +
    'and assume the mean-voltage model when it is not; switching losses are estimates from gate charge and drive current, not measurements.',
  'Prices are the best catalogue offer at the board quantity when the report was generated; prices, stock and lead times change.',
];

export function drawAssumptions(layout: ReportLayout): void {
  layout.heading('Assumptions');
  ASSUMPTIONS.forEach((a) => {
    layout.bullet(a);
    layout.gap(2);
  });
}

/** Design-specific cautions from matching, without the standing ones already printed. */
export function extraCautions(match: DesignMatch): string[] {
  const standing = new Set(CAUTIONS.flatMap((c) => [`${c.title}: ${c.text}`, c.text]));
  return [...new Set(match.cautions)].filter((c) => !standing.has(c));
}

export function drawCautions(layout: ReportLayout, match: DesignMatch): void {
  layout.heading('Cautions');
  for (const c of CAUTIONS) {
    layout.ensureSpace(30);
    layout.paragraph(c.title, { bold: true });
    layout.paragraph(c.text, { indentPt: 10 });
    layout.gap(3);
  }
  const extra = extraCautions(match);
  if (extra.length > 0) {
    layout.subheading('For this design');
    extra.forEach((c) => layout.bullet(c));
  }
  layout.gap(10);
  layout.paragraph(DEFERRAL_LINE, { bold: true, keepTogether: true });
}
