import { describe, expect, it } from 'vitest';
import { decadeValues, E_SERIES_MANTISSAS, roundDownToSeries, roundUpToSeries, standardValues } from '../../src/lib/eseries.ts';

describe('E-series tables', () => {
  it.each([
    ['E6', [10, 15, 22, 33, 47, 68]], // IEC 60063 E6 table
    ['E12', [10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82]], // IEC 60063 E12 table
    ['E24', [10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91]], // IEC 60063 E24 table
  ] as const)('%s matches IEC 60063', (series, values) => {
    expect(E_SERIES_MANTISSAS[series]).toEqual(values);
  });

  it('E6 is every second E12 value and E12 every second E24 value', () => {
    // IEC 60063 structure: each series is a subset of the next finer one
    expect(E_SERIES_MANTISSAS.E12.filter((_, i) => i % 2 === 0)).toEqual(E_SERIES_MANTISSAS.E6);
    expect(E_SERIES_MANTISSAS.E24.filter((_, i) => i % 2 === 0)).toEqual(E_SERIES_MANTISSAS.E12);
  });

  it('E96 has 96 ascending values, each within rounding of 100·10^(i/96)', () => {
    // from memory (IEC 60063 E96), checked against its geometric definition
    const e96 = E_SERIES_MANTISSAS.E96;
    expect(e96).toHaveLength(96);
    e96.forEach((v, i) => expect(Math.abs(v - 100 * 10 ** (i / 96))).toBeLessThanOrEqual(0.6));
  });

  it('E48 is every second E96 value', () => {
    // from memory (IEC 60063 E48), checked as the every-other subset of E96
    expect(E_SERIES_MANTISSAS.E48).toHaveLength(48);
    expect(E_SERIES_MANTISSAS.E96.filter((_, i) => i % 2 === 0)).toEqual(E_SERIES_MANTISSAS.E48);
  });
});

describe('decades and ranges', () => {
  it.each([
    ['E12', 3, [1000, 1200, 1500, 1800, 2200, 2700, 3300, 3900, 4700, 5600, 6800, 8200]], // IEC 60063 E12 × 10³
    ['E6', -1, [0.1, 0.15, 0.22, 0.33, 0.47, 0.68]], // IEC 60063 E6 × 10⁻¹
    ['E96', 4, [10000, 10200, 10500]], // IEC 60063 E96 (first three, from memory)
  ] as const)('%s decade 10^%d', (series, decade, expected) => {
    const values = decadeValues(series, decade);
    expected.forEach((v, i) => expect(values[i]).toBe(v));
  });

  it('lists standard values in a range inclusive', () => {
    expect(standardValues('E6', 1000, 10000)).toEqual([1000, 1500, 2200, 3300, 4700, 6800, 10000]); // IEC 60063 E6
  });
});

describe.each([
  // ohms, series, down, up — IEC 60063 tables
  [7142.857, 'E12', 6800, 8200], // docs/engineering.md §9 example 1 rounds down to 6.8 kΩ
  [3571.43, 'E12', 3300, 3900], // docs/engineering.md §9 example 2 rounds down to 3.3 kΩ
  [26000, 'E12', 22000, 27000], // docs/engineering.md §9 example 3 rounds down to 22 kΩ
  [4700, 'E12', 4700, 4700], // exact standard value stays
  [825, 'E12', 820, 1000], // pin-current minimum rounds up
  [9999, 'E24', 9100, 10000], // decade boundary
  [0.5, 'E6', 0.47, 0.68], // below one ohm
  [10050, 'E96', 10000, 10200], // IEC 60063 E96 (from memory)
  [10050, 'E48', 10000, 10500], // IEC 60063 E48 (from memory)
] as const)('rounding %d Ω in %s', (ohms, series, down, up) => {
  it(`down to ${down}, up to ${up}`, () => {
    expect(roundDownToSeries(ohms, series)).toBeCloseTo(down, 9);
    expect(roundUpToSeries(ohms, series)).toBeCloseTo(up, 9);
  });
});

it('rejects non-positive resistances', () => {
  expect(roundDownToSeries(0, 'E12')).toBeNull(); // nothing to round
  expect(roundUpToSeries(-5, 'E12')).toBeNull(); // nothing to round
});
