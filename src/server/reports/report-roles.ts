/** Report section 5: per role (switch, gate drive, diode) the chosen part, every check, and the alternates. */
import type { PartRole, RoleSelection } from '../../lib/domain/design.ts';
import type { Part } from '../../lib/domain/parts.ts';
import type { DesignMatch } from '../../lib/design-match.ts';
import { checkRow, money, quantity, sig, summaryOf, verdictText } from './report-format.ts';
import type { ReportLayout } from './report-layout.ts';
import { reviewWords } from '../../lib/readiness.ts';
import { driversRankedForLine, stallProtectionText, switchDriveLine } from '../../lib/design-words.ts';
import { drawTable, tableHeightPt, type TableColumn } from './report-table.ts';

/** A chosen part's facts and checks stay on one page when together they take less than this. */
const KEEP_TOGETHER_MAX_PT = 420;

export interface RoleContext {
  match: DesignMatch;
  selections: Record<PartRole, RoleSelection>;
  partsById: Map<number, Part>;
  /** True when the font draws ✓ and ✕. */
  verdictMarks: boolean;
  /** Lowest supply of the gate driver's rail (src/lib/design-input.ts driverSupplyRangeOf). */
  driverSupplyMinV: number;
}

const CHECK_COLUMNS: readonly TableColumn[] = [
  { title: 'Check', widthFraction: 0.15 },
  { title: 'Value', widthFraction: 0.1, align: 'right' },
  { title: 'Limit', widthFraction: 0.1, align: 'right' },
  { title: 'Margin', widthFraction: 0.08, align: 'right' },
  { title: 'OK', widthFraction: 0.1 },
  { title: 'Note', widthFraction: 0.47 },
];

const ALTERNATE_COLUMNS: readonly TableColumn[] = [
  { title: 'Part number', widthFraction: 0.16 },
  { title: 'Maker', widthFraction: 0.17 },
  { title: 'Verdict', widthFraction: 0.1 },
  { title: 'Price', widthFraction: 0.15 },
  { title: 'Summary', widthFraction: 0.42 },
];

/** Any ranked entry: switch entries carry an evaluation, driver entries a pairing. */
type RoleEntry = DesignMatch['switch'][number] | DesignMatch['driver'][number] | DesignMatch['diode'][number];

const findEntry = (list: readonly RoleEntry[], partId: number | null): RoleEntry | undefined =>
  partId == null ? undefined : list.find((e) => e.partId === partId);

function extraFacts(entry: RoleEntry): [string, string][] {
  const facts: [string, string][] = [];
  if ('evaluation' in entry) {
    const e = entry.evaluation;
    facts.push([
      'At this drive',
      `RDS(on) ${quantity(e.rdsOnAtDriveOhms, 'Ω')} at 25 °C, junction ${quantity(e.junctionC, '°C')}, conduction ${quantity(e.conductionLossW, 'W')}, switching ${quantity(e.switchingLossW, 'W')}`,
    ]);
  }
  if ('pairing' in entry) {
    const p = entry.pairing;
    facts.push(['Pairing', `drives ${p.switchMpn} at ${sig(p.gateDriveV)} V; ${p.inverting ? 'inverting' : 'non-inverting'}`]);
  }
  return facts;
}

/** Room to keep below a role's heading: the chosen part's whole block when it is short enough. */
function keepWithPt(layout: ReportLayout, entry: RoleEntry | undefined): number {
  if (!entry) return 60;
  const blockHeightPt = 110 + tableHeightPt(layout, CHECK_COLUMNS, entry.checks.map(checkRow));
  return blockHeightPt < KEEP_TOGETHER_MAX_PT ? blockHeightPt : 80;
}

function drawChosen(layout: ReportLayout, ctx: RoleContext, label: string, entry: RoleEntry): void {
  layout.subheading(`${label}: ${entry.mpn}`, keepWithPt(layout, entry));
  const review = entry.reviewStatus === 'approved' ? '' : `, ${reviewWords(entry.reviewStatus)}`;
  layout.keyValues([
    ['Part', `${entry.mpn} (${entry.manufacturer}), ${entry.package || 'package not given'}`],
    ['Verdict', `${verdictText(entry.verdict, ctx.verdictMarks)} (score ${sig(entry.score)})`],
    ['Price', money(entry.priceAtQty)],
    ['Lifecycle', `${entry.lifecycle}${review}`],
    ...extraFacts(entry),
  ]);
  layout.gap(4);
  drawTable(layout, CHECK_COLUMNS, entry.checks.map(checkRow));
}

function drawAlternates(layout: ReportLayout, ctx: RoleContext, list: readonly RoleEntry[], selection: RoleSelection): void {
  const ids = selection.alternatePartIds.slice(0, 3);
  if (ids.length === 0) {
    layout.paragraph('Alternates: none chosen.');
    return;
  }
  const rows = ids.map((id) => {
    const entry = findEntry(list, id);
    const part = ctx.partsById.get(id);
    if (!entry) return [part?.mpn ?? `part ${id}`, part?.manufacturer ?? '—', '—', '—', 'Not among the ranked candidates for this design.'];
    const verdict =
      verdictText(entry.verdict, ctx.verdictMarks) + (entry.reviewStatus === 'approved' ? '' : ` (${reviewWords(entry.reviewStatus)})`);
    return [entry.mpn, entry.manufacturer, verdict, money(entry.priceAtQty, true), summaryOf(entry.checks)];
  });
  layout.subheading('Alternates', 40);
  drawTable(layout, ALTERNATE_COLUMNS, rows);
}

function drawRole(layout: ReportLayout, ctx: RoleContext, role: PartRole, label: string, list: readonly RoleEntry[]): void {
  const selection = ctx.selections[role];
  const entry = findEntry(list, selection.chosenPartId);
  if (selection.chosenPartId == null) layout.paragraph(`No ${label.toLowerCase()} has been chosen for this design.`, { bold: true });
  else if (!entry) {
    const part = ctx.partsById.get(selection.chosenPartId);
    layout.paragraph(
      `The chosen ${label.toLowerCase()} (${part?.mpn ?? `part ${selection.chosenPartId}`}) is not among the ranked candidates for these inputs: choose again.`,
      { bold: true },
    );
  } else drawChosen(layout, ctx, label, entry);
  drawAlternates(layout, ctx, list, selection);
}

export function drawSwitchRole(layout: ReportLayout, ctx: RoleContext): void {
  const { match } = ctx;
  const list = match.driverNeeded ? match.switchWithDriver : match.switch;
  layout.heading('Switch', 40 + keepWithPt(layout, findEntry(list, ctx.selections.switch.chosenPartId)));
  layout.paragraph(
    match.driverNeeded
      ? 'Low-side N-channel MOSFET, driven through a gate driver.'
      : 'Low-side N-channel MOSFET, with its gate driven straight from the logic pin.',
  );
  layout.paragraph(switchDriveLine(match.switchDrive, ctx.driverSupplyMinV));
  layout.paragraph(`Jammed shaft judged with stall protection ${stallProtectionText(match.worstCase.stall.protection)}.`);
  drawRole(layout, ctx, 'switch', 'Switch', list);
}

export function drawGateDriveRole(layout: ReportLayout, ctx: RoleContext): void {
  const { match } = ctx;
  const driver = match.driverNeeded ? findEntry(match.driver, ctx.selections.driver.chosenPartId) : undefined;
  layout.heading('Gate drive', match.driverNeeded ? 60 + keepWithPt(layout, driver) : 40);
  if (!match.driverNeeded) {
    layout.paragraph(
      'Direct drive from the logic pin: the logic high level reaches a specified RDS(on) point of the chosen switch, so no gate driver is needed.',
    );
    return;
  }
  layout.paragraph(match.driverNeededNote ?? 'A gate driver is needed.');
  if (match.requiredGateDriveV != null) layout.paragraph(`Required gate drive: at least ${sig(match.requiredGateDriveV)} V at the gate.`);
  const paired = match.driver[0]?.pairing;
  layout.paragraph(
    driversRankedForLine(paired?.switchMpn ?? null, paired != null && paired.switchPartId === ctx.selections.switch.chosenPartId),
  );
  drawRole(layout, ctx, 'driver', 'Gate driver', match.driver);
}

export function drawDiodeRole(layout: ReportLayout, ctx: RoleContext): void {
  layout.heading('Freewheel diode', 40 + keepWithPt(layout, findEntry(ctx.match.diode, ctx.selections.diode.chosenPartId)));
  layout.paragraph(
    `Across the motor, cathode to the positive supply; worst-case mean current ${quantity(ctx.match.worstCase.diodeMeanCurrentA, 'A')}.`,
  );
  drawRole(layout, ctx, 'diode', 'Freewheel diode', ctx.match.diode);
}
