/** Fields of the part form per category: key in the schema, label, display unit and scale to SI. */
import { tidy } from '../../lib/units.ts';
import type { PartCategory } from '../../lib/domain/parts.ts';

export interface FormField {
  key: string;
  label: string;
  unit?: string;
  /** SI value = typed × scale. */
  scale?: number;
  kind: 'number' | 'integer' | 'select' | 'boolean';
  optional?: boolean;
  options?: { value: string; label: string }[];
  hint?: string;
}

const num = (key: string, label: string, unit: string, extra: Partial<FormField> = {}): FormField => ({
  key,
  label,
  unit,
  kind: 'number',
  ...extra,
});

export const PARAM_FIELDS: Record<PartCategory, FormField[]> = {
  mosfet: [
    {
      key: 'channel',
      label: 'Channel',
      kind: 'select',
      options: [
        { value: 'n', label: 'N-channel' },
        { value: 'p', label: 'P-channel' },
      ],
    },
    num('vdsMaxV', 'V(BR)DSS', 'V'),
    num('vgsMaxV', 'VGS(max)', 'V', { hint: 'absolute maximum, magnitude' }),
    num('vgsThMinV', 'VGS(th) min', 'V'),
    num('vgsThMaxV', 'VGS(th) max', 'V'),
    num('vgsThTestCurrentA', 'VGS(th) test current', 'µA', { scale: 1e-6 }),
    num('idContinuousA', 'ID continuous (TA 25 °C)', 'A'),
    num('idPulsedA', 'IDM pulsed', 'A'),
    num('qgTotalNc', 'Qg total', 'nC'),
    num('qgTestVgsV', 'Qg test VGS', 'V'),
    num('qgsNc', 'Qgs', 'nC', { optional: true }),
    num('qgdNc', 'Qgd', 'nC', { optional: true }),
    num('vPlateauV', 'Miller plateau', 'V', { optional: true }),
    num('rthJaCPerW', 'RθJA', 'K/W'),
    num('tjMaxC', 'Tj max', '°C'),
    num('bodyDiodeVfV', 'Body-diode VF', 'V', { optional: true }),
  ],
  driver: [
    {
      key: 'kind',
      label: 'Kind',
      kind: 'select',
      options: [
        { value: 'gate-driver', label: 'Gate driver' },
        { value: 'level-shifter', label: 'Level shifter' },
      ],
    },
    { key: 'channels', label: 'Channels', kind: 'integer' },
    { key: 'inverting', label: 'Inverting output', kind: 'boolean' },
    num('supplyMinV', 'Supply min', 'V'),
    num('supplyMaxV', 'Supply max', 'V'),
    {
      key: 'inputLogic',
      label: 'Input thresholds',
      kind: 'select',
      options: [
        { value: 'fixed', label: 'Fixed volts (TTL-style)' },
        { value: 'ratio', label: 'Fraction of own supply (CMOS)' },
        { value: 'input-rail', label: 'Fraction of the input rail' },
      ],
    },
    num('inputHighMin', 'VIH min', 'V or fraction', { hint: 'volts for fixed; 0–1 otherwise' }),
    num('inputLowMax', 'VIL max', 'V or fraction'),
    num('outputHighDropV', 'Output high drop below supply', 'V'),
    num('outputLowMaxV', 'VOL max', 'V'),
    num('sourceCurrentA', 'Peak source current', 'A'),
    num('sinkCurrentA', 'Peak sink current', 'A'),
    num('propagationDelayNs', 'Propagation delay', 'ns'),
    // The INPUT pin's own pull as the datasheet draws it, never the output state: the output with an
    // open input is derived from this and "Inverting output" (the form shows it as a hint).
    {
      key: 'inputPull',
      label: 'Internal input pull (on the input pin)',
      kind: 'select',
      hint: 'as the datasheet states the input structure, not what the output does',
      options: [
        { value: 'down', label: 'Pull-down on the input (to ground)' },
        { value: 'up', label: 'Pull-up on the input (to its supply)' },
        { value: 'none', label: 'None: an open input floats' },
      ],
    },
    num('inputPullOhms', 'Input pull resistance', 'kΩ', {
      scale: 1e3,
      optional: true,
      hint: 'typical value; leave empty when the datasheet does not state it',
    }),
  ],
  diode: [
    {
      key: 'kind',
      label: 'Kind',
      kind: 'select',
      options: [
        { value: 'schottky', label: 'Schottky' },
        { value: 'ultrafast', label: 'Ultrafast' },
        { value: 'fast', label: 'Fast' },
        { value: 'general', label: 'General purpose' },
      ],
    },
    num('vrrmV', 'VRRM', 'V'),
    num('ifAvA', 'IF(AV)', 'A'),
    num('ifsmA', 'IFSM', 'A'),
    num('vfV', 'VF max', 'V'),
    num('vfAtIfA', 'VF test current', 'A'),
    num('trrNs', 'trr', 'ns', { optional: true, hint: 'leave empty for Schottky parts' }),
    num('ifrmA', 'IFRM repetitive peak', 'A', { optional: true }),
    num('rthJaCPerW', 'RθJA', 'K/W', { optional: true, hint: 'junction to ambient, datasheet test board' }),
    num('tjMaxC', 'Tj max', '°C', { optional: true }),
  ],
  motor: [
    num('ratedVoltageV', 'Rated voltage', 'V'),
    num('voltageMinV', 'Voltage min', 'V', { optional: true }),
    num('voltageMaxV', 'Voltage max', 'V', { optional: true }),
    num('noLoadSpeedRpm', 'No-load speed', 'rpm'),
    num('noLoadCurrentA', 'No-load current', 'A'),
    num('stallTorqueNm', 'Stall torque', 'mN·m', { scale: 1e-3 }),
    num('stallCurrentA', 'Stall current', 'A'),
    num('terminalResistanceOhm', 'Terminal resistance (20 °C)', 'Ω', { optional: true }),
    num('inductanceH', 'Inductance', 'mH', { scale: 1e-3, optional: true }),
    num('rotorInertiaKgM2', 'Rotor inertia', 'g·cm²', { scale: 1e-7, optional: true }),
  ],
};

export const RDS_FIELDS: FormField[] = [
  num('vgsV', 'VGS', 'V'),
  num('tjC', 'Tj', '°C'),
  num('idA', 'ID', 'A', { optional: true }),
  num('maxOhm', 'Max', 'mΩ', { scale: 1e-3 }),
  num('typOhm', 'Typ', 'mΩ', { scale: 1e-3, optional: true }),
];

/** One Zth point of the form: pulse length typed in the row's unit (ms or s), Zth in K/W. */
export const ZTH_PULSE_FIELDS: Record<'ms' | 's', FormField> = {
  ms: num('pulseS', 'Pulse length', 'ms', { scale: 1e-3 }),
  s: num('pulseS', 'Pulse length', 's'),
};
export const ZTH_VALUE_FIELD: FormField = num('zthCPerW', 'Zth(j-a)', 'K/W');

/** Typed text → SI number (undefined when empty, NaN kept so the schema names the field). */
export function parseTyped(field: FormField, typed: string): number | null | undefined {
  const t = typed.trim().replace(',', '.');
  if (t === '') return field.optional ? null : undefined;
  const n = Number(t);
  return Number.isFinite(n) ? tidy(n * (field.scale ?? 1)) : Number.NaN;
}

export function showTyped(field: FormField, value: unknown): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return String(tidy(value / (field.scale ?? 1)));
  return String(value);
}
