/** Form state of the motor calculator and its conversion to API requests (pure, browser-safe). */
import { TORQUE_UNITS, torqueToNm, radPerSToRpm, type TorqueUnit } from '../../lib/units.ts';

export const SPEED_UNITS = ['rpm', 'rad/s'] as const;
export const CURRENT_UNITS = ['A', 'mA'] as const;
export { TORQUE_UNITS };

export interface MotorForm {
  ratedV: string;
  noLoadSpeed: string;
  speedUnit: (typeof SPEED_UNITS)[number];
  noLoadCurrent: string;
  noLoadCurrentUnit: (typeof CURRENT_UNITS)[number];
  stallCurrent: string;
  stallCurrentUnit: (typeof CURRENT_UNITS)[number];
  stallTorque: string;
  torqueUnit: TorqueUnit;
  supplyMinV: string;
  supplyMaxV: string;
  seriesOhm: string;
}

/** An invented, self-consistent 3 V motor (the worked example of the engineering notes) on a sagging pack. */
export const DEFAULT_MOTOR_FORM: MotorForm = {
  ratedV: '3',
  noLoadSpeed: '12000',
  speedUnit: 'rpm',
  noLoadCurrent: '0.2',
  noLoadCurrentUnit: 'A',
  stallCurrent: '1.8',
  stallCurrentUnit: 'A',
  stallTorque: '3.3953',
  torqueUnit: 'mN·m',
  supplyMinV: '2.4',
  supplyMaxV: '3.3',
  seriesOhm: '0',
};

export type FieldErrors = Partial<Record<keyof MotorForm, string>>;

/** The labels the form shows, used to name refused fields (never the API's paths). */
export const MOTOR_FIELD_LABELS: Record<keyof MotorForm, string> = {
  ratedV: 'Rated voltage',
  noLoadSpeed: 'No-load speed',
  speedUnit: 'No-load speed unit',
  noLoadCurrent: 'No-load current',
  noLoadCurrentUnit: 'No-load current unit',
  stallCurrent: 'Stall current',
  stallCurrentUnit: 'Stall current unit',
  stallTorque: 'Stall torque',
  torqueUnit: 'Stall torque unit',
  supplyMinV: 'Supply minimum',
  supplyMaxV: 'Supply maximum',
  seriesOhm: 'Series resistance',
};

const num = (s: string): number => (s.trim() === '' ? Number.NaN : Number(s.replace(',', '.')));

/** Maps an API issue path back to the form field that caused it. */
export const PATH_TO_FIELD: Record<string, keyof MotorForm> = {
  'motor.ratedVoltageV': 'ratedV',
  'motor.noLoadSpeedRpm': 'noLoadSpeed',
  'motor.noLoadCurrentA': 'noLoadCurrent',
  'motor.stallCurrentA': 'stallCurrent',
  'motor.stallTorqueNm': 'stallTorque',
  seriesResistanceOhm: 'seriesOhm',
};

export interface MotorRequests {
  min: unknown;
  max: unknown;
}

/** Converts the form to the two API bodies (minimum and maximum supply), or field errors. */
export function toRequests(f: MotorForm): { ok: true; requests: MotorRequests } | { ok: false; errors: FieldErrors } {
  const errors: FieldErrors = {};
  const need = (key: keyof MotorForm, allowZero = false): number => {
    const v = num(f[key] as string);
    if (!Number.isFinite(v)) errors[key] = 'Enter a number.';
    else if (v < 0 || (!allowZero && v === 0)) errors[key] = allowZero ? 'Must not be negative.' : 'Must be above zero.';
    return v;
  };
  const ratedVoltageV = need('ratedV');
  const speed = need('noLoadSpeed');
  const i0 = need('noLoadCurrent');
  const is = need('stallCurrent');
  const ts = need('stallTorque');
  const vMin = need('supplyMinV');
  const vMax = need('supplyMaxV');
  const seriesResistanceOhm = need('seriesOhm', true);
  if (!errors.supplyMinV && !errors.supplyMaxV && vMin > vMax) errors.supplyMinV = 'Minimum supply is above the maximum.';
  if (Object.keys(errors).length) return { ok: false, errors };
  const amps = (value: number, unit: (typeof CURRENT_UNITS)[number]) => (unit === 'mA' ? value / 1000 : value);
  const motor = {
    ratedVoltageV,
    noLoadSpeedRpm: f.speedUnit === 'rad/s' ? radPerSToRpm(speed) : speed,
    noLoadCurrentA: amps(i0, f.noLoadCurrentUnit),
    stallCurrentA: amps(is, f.stallCurrentUnit),
    stallTorqueNm: torqueToNm(ts, f.torqueUnit),
  };
  const body = (supplyV: number) => ({ motor, supplyV, seriesResistanceOhm, curvePoints: 41 });
  return { ok: true, requests: { min: body(vMin), max: body(vMax) } };
}
