/**
 * Words for what a design is judged at, shared by the workspace, the report and the bill of materials:
 * the gate drive the switches are judged at, which switch the drivers are ranked for, the stall
 * protection, the motor's state at reset, and readable names for check ids. Pure.
 */
import { fmt } from './checks.ts';
import type { StallProtection } from './domain/design.ts';
import type { WorstCase } from './design-case.ts';
import type { MotorState } from './power-on.ts';
import type { SwitchDrive } from './rank-design.ts';
import { measure, sig } from './units.ts';

const amps = (a: number): string => (Math.abs(a) < 1 ? `${fmt(a * 1000)} mA` : `${fmt(a)} A`);

/**
 * One line: at what gate drive the switch list is judged. `driverSupplyMinV` is the lowest driver supply
 * (src/lib/design-input.ts driverSupplyRangeOf), the level a driver's output high is taken at.
 */
export function switchDriveLine(drive: SwitchDrive, driverSupplyMinV: number): string {
  if (drive.by === 'pin') {
    const draw = drive.pullDownDrawA > 0 ? `, less the ${amps(drive.pullDownDrawA)} the recommended gate pull-down draws` : '';
    return `Switches are judged at the controller pin: ${fmt(drive.gateV)} V gate drive (the logic high minimum), ${amps(drive.sourceCurrentA)} source current${draw}.`;
  }
  const who = drive.driverMpn ?? 'a catalogue driver';
  const status = drive.provisional
    ? 'provisional: no driver is chosen yet, so this is the best real driver in the catalogue; choosing one re-judges the list'
    : 'the chosen driver';
  return `Switches are judged at driver ${who}: ${fmt(drive.gateV)} V gate drive, its output high from the lowest driver supply of ${fmt(driverSupplyMinV)} V (${status}).`;
}

/** Short form for a table cell or a BOM note: "2.9 V from the controller pin", "11.1 V from driver X (provisional)". */
export function judgedAtShort(drive: SwitchDrive): string {
  if (drive.by === 'pin') return `judged at ${fmt(drive.gateV)} V gate drive from the controller pin`;
  return `judged at ${fmt(drive.gateV)} V gate drive from driver ${drive.driverMpn ?? '(unnamed)'}${drive.provisional ? ' (provisional, no driver chosen)' : ''}`;
}

/** Which switch the driver list is ranked for: the chosen one, or the best switch so far. */
export function driversRankedForLine(switchMpn: string | null, switchChosen: boolean): string {
  if (switchMpn == null) return 'No switch to pair with yet: the drivers are not ranked.';
  return switchChosen
    ? `Drivers are ranked for the chosen switch ${switchMpn}: each is judged with that switch at its own output.`
    : `Drivers are ranked for ${switchMpn}, the best switch so far (none chosen yet): choosing another switch re-pairs them.`;
}

/** A driver's pairing in a few words: "paired with switch X at 11.1 V gate drive". */
export function pairedWithShort(pairing: { switchMpn: string; gateDriveV: number }): string {
  return `paired with switch ${pairing.switchMpn} at ${fmt(pairing.gateDriveV)} V gate drive`;
}

/**
 * The bill of materials' pairing notes: the switch line says at what drive it is judged, the driver line
 * which switch it is paired with (the chosen driver's entry in the match).
 */
export function bomPairingNotes(
  match: { switchDrive: SwitchDrive; driver: readonly { partId?: number | null; pairing: { switchMpn: string; gateDriveV: number } }[] },
  chosenDriverId: number | null,
): { switch: string; driver?: string } {
  const driver = chosenDriverId == null ? undefined : match.driver.find((d) => d.partId === chosenDriverId);
  return { switch: judgedAtShort(match.switchDrive), ...(driver ? { driver: pairedWithShort(driver.pairing) } : {}) };
}

/** The stall protection in words, with what it means for the jam the parts are judged at. */
export function stallProtectionText(p: StallProtection): string {
  if (p.kind === 'current-limit') return `current limit at ${fmt(p.limitA)} A: a jam settles at that current (steady state)`;
  if (p.kind === 'cut-off')
    return `cut-off after ${fmt(p.afterS)} s: a jam heats the parts for that long (single-pulse Zth where the part has it, else steady state)`;
  return 'none: a jam holds the switch on at full stall current until someone notices (steady state, the worst case)';
}

const MOTOR_STATE: Readonly<Record<MotorState, string>> = {
  off: 'off: the motor stays still through power-on and reset',
  on: 'on: the motor runs at power-on or reset',
  'may-run': 'may run: the gate is not surely held off at power-on or reset',
};

export function motorStateText(state: MotorState): string {
  return MOTOR_STATE[state];
}

/**
 * Readable names of every check the engines emit (mosfet-checks, diode-checks, driver-checks,
 * driver-ranking, supply, supply-design): the one table the workspace, the report, the BOM and CSV notes,
 * the failure summaries and the alert mails read. The stable id stays in the data (and in a tooltip on
 * screen); tests/unit/check-labels.test.ts fails when an engine emits an id missing here.
 */
export const CHECK_LABELS: Readonly<Record<string, string>> = {
  channel: 'Channel type',
  'drain-voltage': 'Drain voltage rating',
  'gate-voltage-rating': 'Gate voltage rating',
  'gate-drive': 'Gate drive level',
  'miller-plateau': 'Miller plateau',
  'rdson-test-current': 'RDS(on) test current',
  'stall-current': 'Stall current (pulse rating)',
  'running-current': 'Running current',
  'junction-temperature': 'Junction temperature, running',
  'stall-thermal': 'Junction temperature, jammed shaft',
  'switching-edges': 'Switching edges',
  'reverse-voltage': 'Reverse voltage',
  'mean-current': 'Mean forward current',
  'peak-current': 'Repetitive peak current',
  'diode-thermal': 'Diode junction temperature',
  'reverse-recovery': 'Reverse recovery',
  'surge-current': 'Start-up surge',
  'drain-spike': 'Drain spike without the diode',
  'input-high': 'Input high (noise margin)',
  'input-low': 'Input low (noise margin)',
  'output-high': 'Output high at the gate',
  'driver-supply': 'Driver supply range',
  'duty-error': 'Duty error from the edges',
  'paired-switch': 'Paired switch',
  'power-on': 'Power-on state',
  polarity: 'Polarity',
  'supply-motor-voltage': 'Supply against the motor’s rated voltage',
  'supply-running-current': 'Running current against the source’s continuous rating',
  'supply-start-current': 'Start current against the source’s current limit',
  'logic-brownout': 'Shared controller rail at start (brown-out)',
};

/** A check's readable name, starting with a capital: "Drain voltage rating". Unknown ids read as words. */
export function checkLabel(id: string): string {
  const label = CHECK_LABELS[id];
  if (label) return label;
  const words = id.replace(/-/g, ' ');
  return words.charAt(0).toUpperCase() + words.slice(1);
}

/** The name inside a sentence: "fails drain voltage rating"; a leading abbreviation keeps its case ("RDS(on) …"). */
export function checkLabelInline(id: string): string {
  const label = checkLabel(id);
  return /^[A-Z]{2}/.test(label) ? label : label.charAt(0).toLowerCase() + label.slice(1);
}

/** Several checks in a sentence, "; " between them since a name may hold a comma. */
export function checkLabelList(ids: readonly string[]): string {
  return ids.map(checkLabelInline).join('; ');
}

export interface FigureRow {
  label: string;
  value: string;
}

const pct = (fraction: number): string => `${fmt(fraction * 100)} %`;

/**
 * The current's shape at the worst-heat point (docs/engineering.md §3 and the ripple rules): peak-to-peak
 * ripple, switch RMS, peak and turn-off current, and whether conduction is discontinuous.
 */
export function rippleRows(wc: WorstCase, inductanceKnown: boolean): { rows: FigureRow[]; note: string | null } {
  if (wc.pwmHz == null) return { rows: [], note: 'On/off drive: no PWM ripple.' };
  const base: FigureRow[] = [
    { label: 'Switch RMS current', value: `${fmt(wc.switchRmsA)} A` },
    { label: 'Switched off at', value: `${fmt(wc.turnOffCurrentA)} A` },
  ];
  const r = wc.ripple;
  if (r == null) {
    const note = inductanceKnown
      ? `The switch heats most at ${pct(wc.switchDuty)} duty, where the current is steady (no ripple).`
      : 'Ripple not computed: enter the motor’s inductance to see the ripple and whether the current reaches zero each cycle.';
    return { rows: base, note };
  }
  const rows: FigureRow[] = [
    { label: `Ripple, peak to peak (duty ${pct(r.duty)}, ${fmt(r.supplyV)} V)`, value: `${fmt(r.rippleA)} A` },
    ...base.slice(0, 1),
    { label: 'Peak current', value: `${fmt(r.peakA)} A` },
    ...base.slice(1),
    { label: 'PWM periods per τe (f·L/R)', value: fmt(r.periodsPerTau) },
    {
      label: 'Conduction',
      value: r.continuous ? 'continuous' : `discontinuous conduction: zero for ${pct(r.zeroFraction)} of each period`,
    },
  ];
  return { rows, note: null };
}

/** The jam the switch and diode are judged at, with the stall protection. */
export function stallRows(wc: WorstCase): FigureRow[] {
  const s = wc.stall;
  const rows: FigureRow[] = [
    {
      label: 'Stall protection',
      value:
        s.protection.kind === 'none'
          ? 'none (worst case)'
          : s.protection.kind === 'current-limit'
            ? `current limit ${fmt(s.protection.limitA)} A`
            : `cut-off after ${fmt(s.protection.afterS)} s`,
    },
    { label: `Jammed: motor current${wc.pwmHz != null ? ` (duty ${pct(s.duty)})` : ''}`, value: `${fmt(s.currentA)} A` },
    { label: 'Jammed: switch RMS current', value: `${fmt(s.currentRmsA)} A` },
  ];
  if (wc.pwmHz != null) rows.push({ label: 'Jammed: diode mean current', value: `${fmt(s.diodeMeanA)} A` });
  return rows;
}

/**
 * A check's value or limit as people read it: prefixed SI through `measure`; a dimensionless figure
 * (the duty error) is a fraction and reads as a percentage ("0.063 %").
 */
export function checkFigure(value: number | null, unit: string): string {
  if (unit === '' && value != null && Number.isFinite(value)) return `${sig(value * 100, 2)} %`;
  return measure(value, unit);
}
