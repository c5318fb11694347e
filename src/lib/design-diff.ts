/**
 * What changed between two revisions of a design, field by field, as a designer reads it: a label, and
 * the value before and after in practitioner units (V, mΩ, mA, kHz, %, °C, mN·m). Pure; parts are named
 * through `partName` (an id the caller cannot name reads "part #id").
 * The rows follow the design's reading order: motor → supply and logic → switch → gate drive → diode →
 * power-on → BOM.
 */
import type { DesignInput, PartRole } from './domain/design.ts';
import { SUPPLY_PRESETS } from './domain/design.ts';
import { PART_ROLE_LABELS } from './labels.ts';
import { percent, quantity, sig } from './units.ts';

export interface DesignChange {
  /** A stable key ("supply.minV", "selections.switch.chosen") for tests and anchors. */
  field: string;
  label: string;
  before: string;
  after: string;
}

export type PartNamer = (partId: number) => string | undefined;

const NONE = '—';
const v = (x: number | null | undefined): string => quantity(x, 'V');
const a = (x: number | null | undefined): string => quantity(x, 'A');
/** A resistance below 1 Ω in mΩ (wiring, shunt, source), above it in Ω or kΩ. */
export const ohms = (x: number | null | undefined): string =>
  x === null || x === undefined
    ? NONE
    : x === 0
      ? '0 Ω'
      : x < 1
        ? quantity(x * 1000, 'mΩ')
        : x < 1000
          ? quantity(x, 'Ω')
          : quantity(x / 1000, 'kΩ');
/** A pin current in mA below 1 A. */
const milliamps = (x: number): string => (x < 1 ? quantity(x * 1000, 'mA') : a(x));
const hertz = (x: number): string => (x >= 1000 ? quantity(x / 1000, 'kHz') : quantity(x, 'Hz'));
const celsius = (x: number): string => quantity(x, '°C');

const presetLabel = (id: string | null): string =>
  id === null ? 'none (entered by hand)' : (SUPPLY_PRESETS.find((p) => p.id === id)?.label ?? id);

function motorText(m: DesignInput['motor'], name: PartNamer): string {
  if (m.source === 'catalogue') return `${name(m.partId) ?? `part #${m.partId}`} (catalogue)`;
  return `${m.label} (entered by hand)`;
}

const MANUAL_MOTOR: {
  key: keyof Extract<DesignInput['motor'], { source: 'manual' }>['params'];
  label: string;
  fmt: (x: number | null) => string;
}[] = [
  { key: 'ratedVoltageV', label: 'Motor rated voltage', fmt: v },
  { key: 'noLoadSpeedRpm', label: 'Motor no-load speed', fmt: (x) => quantity(x, 'rpm', 4) },
  { key: 'noLoadCurrentA', label: 'Motor no-load current', fmt: (x) => (x === null ? NONE : milliamps(x)) },
  { key: 'stallTorqueNm', label: 'Motor stall torque', fmt: (x) => (x === null ? NONE : quantity(x * 1000, 'mN·m')) },
  { key: 'stallCurrentA', label: 'Motor stall current', fmt: a },
  { key: 'terminalResistanceOhm', label: 'Motor terminal resistance', fmt: ohms },
  { key: 'voltageMinV', label: 'Motor operating minimum', fmt: v },
  { key: 'voltageMaxV', label: 'Motor operating maximum', fmt: v },
  { key: 'inductanceH', label: 'Motor inductance', fmt: (x) => (x === null ? NONE : quantity(x * 1000, 'mH')) },
  { key: 'rotorInertiaKgM2', label: 'Rotor inertia', fmt: (x) => (x === null ? NONE : quantity(x * 1e7, 'g·cm²')) },
];

function loadText(l: DesignInput['load']): string {
  if (l.kind === 'stall-only') return 'stall only (no running load given)';
  if (l.kind === 'torque') return `torque ${quantity(l.torqueNm * 1000, 'mN·m')}`;
  return `speed ${quantity(l.speedRpm, 'rpm', 4)}`;
}

function driveText(d: DesignInput['drive']): string {
  return d.mode === 'onoff' ? 'on/off' : `PWM ${hertz(d.frequencyHz)}, duty ${percent(d.dutyMin)} – ${percent(d.dutyMax)}`;
}

function sharedText(s: DesignInput['logic']['sharedSupply']): string {
  return s === null ? 'its own supply' : `the motor supply (brown-out ${v(s.minSupplyV)}, regulator dropout ${v(s.regulatorDropoutV)})`;
}

const PULL = { up: 'pull-up', down: 'pull-down', none: 'none (pin floats at reset)' } as const;

function protectionText(p: DesignInput['stallProtection']): string {
  if (p.kind === 'none') return 'none';
  if (p.kind === 'current-limit') return `current limit ${a(p.limitA)}`;
  return `cut-off after ${quantity(p.afterS, 's')}`;
}

const partList = (ids: number[], name: PartNamer): string =>
  ids.length === 0 ? 'none' : ids.map((id) => name(id) ?? `part #${id}`).join(', ');

/** Every field that differs between `before` and `after`, in reading order; [] when they are the same. */
export function diffDesignInputs(before: DesignInput, after: DesignInput, partName: PartNamer = () => undefined): DesignChange[] {
  const out: DesignChange[] = [];
  const add = (field: string, label: string, b: string, c: string): void => {
    if (b !== c) out.push({ field, label, before: b, after: c });
  };
  add('name', 'Design name', before.name, after.name);

  // Motor and its load
  add('motor', 'Motor', motorText(before.motor, partName), motorText(after.motor, partName));
  if (before.motor.source === 'manual' && after.motor.source === 'manual') {
    for (const m of MANUAL_MOTOR)
      add(`motor.params.${m.key}`, m.label, m.fmt(before.motor.params[m.key]), m.fmt(after.motor.params[m.key]));
  }
  add('load', 'Running load', loadText(before.load), loadText(after.load));
  add('drive', 'Drive', driveText(before.drive), driveText(after.drive));

  // Supply and logic
  add('supply.preset', 'Supply preset', presetLabel(before.supply.preset), presetLabel(after.supply.preset));
  add('supply.minV', 'Supply minimum', v(before.supply.minV), v(after.supply.minV));
  add('supply.nomV', 'Supply nominal', v(before.supply.nomV), v(after.supply.nomV));
  add('supply.maxV', 'Supply maximum', v(before.supply.maxV), v(after.supply.maxV));
  add(
    'supply.internalResistanceOhm',
    'Supply internal resistance',
    ohms(before.supply.internalResistanceOhm),
    ohms(after.supply.internalResistanceOhm),
  );
  const rating = (x: number | null): string => (x === null ? 'not stated' : a(x));
  add(
    'supply.continuousCurrentA',
    'Supply continuous rating',
    rating(before.supply.continuousCurrentA),
    rating(after.supply.continuousCurrentA),
  );
  const limit = (x: number | null): string => (x === null ? 'none' : a(x));
  add('supply.currentLimitA', 'Supply current limit', limit(before.supply.currentLimitA), limit(after.supply.currentLimitA));
  add('wiringResistanceOhm', 'Wiring resistance', ohms(before.wiringResistanceOhm), ohms(after.wiringResistanceOhm));
  add('shuntResistanceOhm', 'Shunt resistance', ohms(before.shuntResistanceOhm), ohms(after.shuntResistanceOhm));
  add('logic.railV', 'Logic rail', v(before.logic.railV), v(after.logic.railV));
  add('logic.highV', 'Logic output high (VOH min)', v(before.logic.highV), v(after.logic.highV));
  add('logic.lowV', 'Logic output low (VOL max)', v(before.logic.lowV), v(after.logic.lowV));
  add(
    'logic.pinSourceCurrentA',
    'Logic pin source current',
    milliamps(before.logic.pinSourceCurrentA),
    milliamps(after.logic.pinSourceCurrentA),
  );
  add('logic.pinSinkCurrentA', 'Logic pin sink current', milliamps(before.logic.pinSinkCurrentA), milliamps(after.logic.pinSinkCurrentA));
  add('logic.sharedSupply', 'Controller fed from', sharedText(before.logic.sharedSupply), sharedText(after.logic.sharedSupply));
  add('ambientMinC', 'Ambient minimum', celsius(before.ambientMinC), celsius(after.ambientMinC));
  add('ambientMaxC', 'Ambient maximum', celsius(before.ambientMaxC), celsius(after.ambientMaxC));
  add('margins.voltageDerating', 'Voltage derating', percent(before.margins.voltageDerating), percent(after.margins.voltageDerating));
  add(
    'margins.thermalMarginC',
    'Thermal margin',
    quantity(before.margins.thermalMarginC, 'K'),
    quantity(after.margins.thermalMarginC, 'K'),
  );

  // The three part lines, in reading order; the gate driver's own rail sits with the driver.
  const pick = (role: PartRole): void => {
    const b = before.selections[role];
    const c = after.selections[role];
    const chosen = (id: number | null): string => (id === null ? 'none chosen' : (partName(id) ?? `part #${id}`));
    add(`selections.${role}.chosen`, `${PART_ROLE_LABELS[role]}: chosen part`, chosen(b.chosenPartId), chosen(c.chosenPartId));
    add(
      `selections.${role}.alternates`,
      `${PART_ROLE_LABELS[role]}: alternates`,
      partList(b.alternatePartIds, partName),
      partList(c.alternatePartIds, partName),
    );
  };
  pick('switch');
  const rail = (x: number | null): string => (x === null ? 'the motor supply' : `its own rail, ${v(x)}`);
  add('driverSupplyV', 'Gate driver supply', rail(before.driverSupplyV), rail(after.driverSupplyV));
  pick('driver');
  pick('diode');

  // Power-on and stall behaviour
  const pull = (l: DesignInput['logic']): string => (l.resetPull === 'none' ? PULL.none : `${PULL[l.resetPull]} ${ohms(l.resetPullOhms)}`);
  add('logic.resetPull', 'Controller pin pull at reset', pull(before.logic), pull(after.logic));
  add('logic.resetPullTolerance', 'Pull tolerance', percent(before.logic.resetPullTolerance), percent(after.logic.resetPullTolerance));
  const intent = (r: DesignInput['resetStartIntent']): string => (r === null ? 'no: the motor must stay off' : `yes: “${r.reason}”`);
  add('resetStartIntent', 'Motor may run at reset', intent(before.resetStartIntent), intent(after.resetStartIntent));
  add('stallProtection', 'Stall protection', protectionText(before.stallProtection), protectionText(after.stallProtection));

  // BOM
  add('boardQuantity', 'Board quantity', sig(before.boardQuantity, 7), sig(after.boardQuantity, 7));
  return out;
}
