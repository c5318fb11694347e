/**
 * Preferred-number series for resistors [IEC 60063].
 * Kept as literal tables: the standard's values cannot all be computed by rounding 10^(i/n)
 * (E24 has 27, 30, 33 … where rounding gives 26, 29, 32 …).
 */

export const E_SERIES_NAMES = ['E6', 'E12', 'E24', 'E48', 'E96'] as const;
export type ESeriesName = (typeof E_SERIES_NAMES)[number];

const E6 = [10, 15, 22, 33, 47, 68] as const;
const E12 = [10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82] as const;
// prettier-ignore
const E24 = [10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91] as const;
// prettier-ignore
const E96 = [
  100, 102, 105, 107, 110, 113, 115, 118, 121, 124, 127, 130, 133, 137, 140, 143,
  147, 150, 154, 158, 162, 165, 169, 174, 178, 182, 187, 191, 196, 200, 205, 210,
  215, 221, 226, 232, 237, 243, 249, 255, 261, 267, 274, 280, 287, 294, 301, 309,
  316, 324, 332, 340, 348, 357, 365, 374, 383, 392, 402, 412, 422, 432, 442, 453,
  464, 475, 487, 499, 511, 523, 536, 549, 562, 576, 590, 604, 619, 634, 649, 665,
  681, 698, 715, 732, 750, 768, 787, 806, 825, 845, 866, 887, 909, 931, 953, 976,
] as const;
// prettier-ignore
const E48 = [
  100, 105, 110, 115, 121, 127, 133, 140, 147, 154, 162, 169, 178, 187, 196, 205,
  215, 226, 237, 249, 261, 274, 287, 301, 316, 332, 348, 365, 383, 402, 422, 442,
  464, 487, 511, 536, 562, 590, 619, 649, 681, 715, 750, 787, 825, 866, 909, 953,
] as const;

/** Significant figures of each series within one decade: two digits (E6–E24) or three (E48, E96). */
export const E_SERIES_MANTISSAS: Readonly<Record<ESeriesName, readonly number[]>> = {
  E6,
  E12,
  E24,
  E48,
  E96,
};

/** Mantissas are integers with 2 or 3 digits; this is the power of ten that makes them 1.0–9.x. */
function mantissaScale(series: ESeriesName): number {
  return series === 'E48' || series === 'E96' ? 2 : 1;
}

/** Integer × 10^k computed so that 4.7 and 6800 come out as the exact nearest doubles. */
function scaleByPowerOfTen(integer: number, exponent: number): number {
  return exponent >= 0 ? integer * 10 ** exponent : integer / 10 ** -exponent;
}

/** Standard values of one decade, e.g. decadeValues('E12', 3) → 1000, 1200 … 8200. */
export function decadeValues(series: ESeriesName, decadeExponent: number): number[] {
  const shift = decadeExponent - mantissaScale(series);
  return E_SERIES_MANTISSAS[series].map((m) => scaleByPowerOfTen(m, shift));
}

/** All standard values from minOhms to maxOhms inclusive, ascending. */
export function standardValues(series: ESeriesName, minOhms: number, maxOhms: number): number[] {
  if (!(minOhms > 0) || !(maxOhms >= minOhms) || !Number.isFinite(maxOhms)) return [];
  const first = Math.floor(Math.log10(minOhms)) - 1;
  const last = Math.ceil(Math.log10(maxOhms)) + 1;
  const values: number[] = [];
  for (let decade = first; decade <= last; decade += 1) {
    for (const v of decadeValues(series, decade)) {
      if (withinTolerance(v, minOhms, 'above') && withinTolerance(v, maxOhms, 'below')) values.push(v);
    }
  }
  return values;
}

/** Relative tolerance so that 6800.000000001 still counts as 6800. */
const RELATIVE_EPSILON = 1e-9;

function withinTolerance(standard: number, bound: number, side: 'above' | 'below'): boolean {
  const slack = Math.abs(bound) * RELATIVE_EPSILON;
  return side === 'above' ? standard >= bound - slack : standard <= bound + slack;
}

function neighbourDecades(series: ESeriesName, ohms: number): number[] {
  const decade = Math.floor(Math.log10(ohms));
  return [...decadeValues(series, decade - 1), ...decadeValues(series, decade), ...decadeValues(series, decade + 1)];
}

/** Largest standard value ≤ ohms (a pull resistor sized as a maximum is rounded down). Null for ohms ≤ 0. */
export function roundDownToSeries(ohms: number, series: ESeriesName): number | null {
  if (!(ohms > 0) || !Number.isFinite(ohms)) return null;
  const below = neighbourDecades(series, ohms).filter((v) => withinTolerance(v, ohms, 'below'));
  return below.length > 0 ? below[below.length - 1] : null;
}

/** Smallest standard value ≥ ohms (a minimum resistance is rounded up). Null for ohms ≤ 0. */
export function roundUpToSeries(ohms: number, series: ESeriesName): number | null {
  if (!(ohms > 0) || !Number.isFinite(ohms)) return null;
  const above = neighbourDecades(series, ohms).filter((v) => withinTolerance(v, ohms, 'above'));
  return above.length > 0 ? above[0] : null;
}
