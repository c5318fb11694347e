/**
 * Realistic ranges for the numbers the schemas accept: finite, inside what a practitioner designing a
 * small motor drive would recognise (with room to spare), so a value such as 5e-324 or 1e308 is a 400
 * naming the field instead of an overflow or a NaN deep in a model. Each range says its unit in words.
 * Fields that already carry a narrower bound keep it; these are the outer fences.
 */
import { z } from 'zod';

export interface Range {
  min: number;
  max: number;
  /** How the range reads in an error message ("from 1 µV to 2 kV"). */
  words: string;
}

export const RANGES = {
  /** Operating voltages (supplies, rails, gate drive, thresholds). */
  voltageV: { min: 1e-6, max: 1000, words: 'a voltage from 1 µV to 1 kV' },
  /** Device voltage ratings (VDS max, VRRM): high-voltage parts go past 1 kV. */
  ratingV: { min: 1e-3, max: 10_000, words: 'a voltage rating from 1 mV to 10 kV' },
  /** Operating and continuous currents, from pin leakage (pA) up. */
  currentA: { min: 1e-12, max: 1000, words: 'a current from 1 pA to 1 kA' },
  /** Pulsed and surge current ratings. */
  surgeA: { min: 1e-9, max: 100_000, words: 'a pulse current from 1 nA to 100 kA' },
  resistanceOhm: { min: 1e-6, max: 1e9, words: 'a resistance from 1 µΩ to 1 GΩ' },
  frequencyHz: { min: 1e-3, max: 1e7, words: 'a frequency from 1 mHz to 10 MHz' },
  temperatureC: { min: -60, max: 250, words: 'a temperature from −60 °C to 250 °C' },
  chargeNc: { min: 1e-6, max: 1e6, words: 'a charge from 1 fC to 1 mC (in nC)' },
  timeNs: { min: 1e-3, max: 1e9, words: 'a time from 1 ps to 1 s (in ns)' },
  timeS: { min: 1e-9, max: 1e6, words: 'a time from 1 ns to about 11 days (in s)' },
  thermalCPerW: { min: 1e-3, max: 1e4, words: 'a thermal resistance from 0.001 to 10 000 K/W' },
  torqueNm: { min: 1e-9, max: 1e4, words: 'a torque from 1 nN·m to 10 kN·m' },
  speedRpm: { min: 1e-3, max: 1e6, words: 'a speed from 0.001 to 1 000 000 rpm' },
  inductanceH: { min: 1e-12, max: 10, words: 'an inductance from 1 pH to 10 H' },
  inertiaKgM2: { min: 1e-15, max: 1, words: 'a rotor inertia from 1e-15 to 1 kg·m²' },
  /** Money per unit: DECIMAL(12,5) in part_price_breaks. */
  unitPrice: { min: 0.00001, max: 9_999_999.99999, words: 'a unit price from 0.00001 to under 10 000 000' },
} as const satisfies Record<string, Range>;

export type RangeName = keyof typeof RANGES;

/** INT UNSIGNED columns (MariaDB). */
export const INT_UNSIGNED_MAX = 4_294_967_295;

const finiteNumber = (label: string): z.ZodNumber =>
  z.number({ error: (issue) => (issue.input === undefined ? `${label} is required` : `${label} must be a number`) });

/** A positive quantity inside its range. */
export function positiveIn(name: RangeName, label = 'The value'): z.ZodNumber {
  const r = RANGES[name];
  const message = `${label} must be ${r.words}`;
  return finiteNumber(label).min(r.min, { error: message }).max(r.max, { error: message });
}

/** Zero, or a positive quantity up to the range's top (a zero resistance, no current). */
export function zeroOrIn(name: RangeName, label = 'The value'): z.ZodNumber {
  const r = RANGES[name];
  const message = `${label} must be 0 or ${r.words}`;
  return finiteNumber(label)
    .min(0, { error: message })
    .max(r.max, { error: message })
    .refine((v) => v === 0 || v >= r.min, { error: message });
}

/** A signed quantity (temperatures) inside its range. */
export function signedIn(name: RangeName, label = 'The value'): z.ZodNumber {
  return positiveIn(name, label);
}

/** A whole number that fits an INT UNSIGNED column. */
export function countIn(min: number, label = 'The value', max = INT_UNSIGNED_MAX): z.ZodNumber {
  return finiteNumber(label)
    .int({ error: `${label} must be a whole number` })
    .min(min, { error: `${label} must be at least ${min}` })
    .max(max, { error: `${label} must be at most ${max}` });
}
