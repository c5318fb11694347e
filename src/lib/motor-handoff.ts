/**
 * Carrying a motor worked out in the calculator into a new design: the calculator writes the datasheet
 * points and supply range (SI) into the address of /designs/new, and the page reads them back through the
 * same bounds the design schema keeps. Pure and browser-safe.
 */
import { z } from 'zod';
import { positiveIn as pos } from './schemas/bounds.ts';
import { tidy } from './units.ts';

/** Query keys, short so the address stays readable. */
const KEYS = {
  ratedVoltageV: 'ratedV',
  noLoadSpeedRpm: 'rpm',
  noLoadCurrentA: 'i0A',
  stallCurrentA: 'isA',
  stallTorqueNm: 'tsNm',
  supplyMinV: 'vMin',
  supplyMaxV: 'vMax',
} as const;

export interface MotorHandoff {
  ratedVoltageV: number;
  noLoadSpeedRpm: number;
  noLoadCurrentA: number;
  stallCurrentA: number;
  stallTorqueNm: number;
  supplyMinV: number;
  supplyMaxV: number;
}

const num = z.coerce.number();
const handoffSchema = z
  .object({
    ratedVoltageV: num.pipe(pos('voltageV')),
    noLoadSpeedRpm: num.pipe(pos('speedRpm')),
    noLoadCurrentA: num.pipe(pos('currentA')),
    stallCurrentA: num.pipe(pos('surgeA')),
    stallTorqueNm: num.pipe(pos('torqueNm')),
    supplyMinV: num.pipe(pos('voltageV').max(60)),
    supplyMaxV: num.pipe(pos('voltageV').max(60)),
  })
  .refine((m) => m.stallCurrentA > m.noLoadCurrentA && m.supplyMinV <= m.supplyMaxV);

/** The /designs/new address that starts a design from these figures. */
export function motorHandoffHref(m: MotorHandoff): string {
  const q = new URLSearchParams();
  // 12 significant digits: far beyond any datasheet, and no binary tail from unit conversions (3.3953 mN·m → 0.0033953 N·m).
  for (const [field, key] of Object.entries(KEYS)) q.set(key, String(tidy(m[field as keyof MotorHandoff])));
  return `/designs/new?${q.toString()}`;
}

/** The figures in a /designs/new address, or null when there are none or they do not hold together. */
export function readMotorHandoff(params: URLSearchParams): MotorHandoff | null {
  if (!params.has(KEYS.ratedVoltageV)) return null;
  const raw: Record<string, string | null> = {};
  for (const [field, key] of Object.entries(KEYS)) raw[field] = params.get(key);
  const parsed = handoffSchema.safeParse(raw);
  return parsed.success ? parsed.data : null;
}
