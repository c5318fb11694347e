/**
 * The number formatter family of src/lib/units.ts, by a hand-written table. Prefixes per the SI Brochure
 * (9th ed., table 7: n, µ, m, k, M); percentages and prices as people write them (common practice).
 */
import { describe, expect, it } from 'vitest';
import { checkFigure } from '../../src/lib/design-words.ts';
import {
  age,
  bytes,
  count,
  bound,
  counted,
  fixed,
  formatSi,
  measure,
  percent,
  prefixFactor,
  price,
  quantity,
  scientific,
  sig,
  tidy,
} from '../../src/lib/units.ts';

describe('sig', () => {
  it.each([
    [0.0012345, 3, '0.00123'],
    [1500, 3, '1500'],
    [1234.5, 2, '1200'],
    [2.5, 3, '2.5'],
    [-0.04567, 2, '-0.046'],
    [0, 3, '0'],
    [null, 3, '—'],
    [undefined, 3, '—'],
    [Number.NaN, 3, '—'],
    [Number.POSITIVE_INFINITY, 3, '—'],
  ] as const)('sig(%s, %i) = %s', (v, d, out) => expect(sig(v, d)).toBe(out));
});

describe('fixed, quantity, percent, price, bytes, tidy', () => {
  it.each([
    [fixed(2.345, 1), '2.3'],
    [fixed(0.5, 2), '0.50'],
    [fixed(null, 2), '—'],
    [quantity(0.48, 'V'), '0.48 V'],
    [quantity(6.15, 'mN·m'), '6.15 mN·m'],
    [quantity(0.3364, 'F'), '0.336 F'],
    [quantity(null, 'A'), '—'],
    [percent(0.256), '26 %'],
    [percent(0.256, 1), '25.6 %'],
    [percent(Number.NaN), '—'],
    [price(0.042, 'EUR'), '0.0420 EUR'],
    [price(1.346, 'USD'), '1.35 USD'],
    [price(null, 'EUR'), '—'],
    [bytes(2.4 * 1024 * 1024), '2.4 MB'],
    [bytes(18 * 1024), '18 kB'],
    [bytes(10), '1 kB'],
  ])('%s', (got, want) => expect(got).toBe(want));

  it('tidy removes floating-point noise of a unit conversion', () => {
    expect(0.1 * 3).not.toBe(0.3);
    expect(tidy(0.1 * 3)).toBe(0.3);
    expect(tidy(4.7 * 1000)).toBe(4700);
  });
});

describe('formatSi prefixes', () => {
  it.each([
    [1.54e-8, 's', '15.4 ns'],
    [1.11e-6, 's', '1.11 µs'],
    [0.0033953, 'N·m', '3.40 mN·m'],
    [0.048, 'Ω', '48.0 mΩ'],
    [6800, 'Ω', '6.80 kΩ'],
    [2_000_000, 'Hz', '2.00 MHz'],
    [999.96, 'V', '1.00 kV'],
  ] as const)('%s %s → %s', (v, unit, out) => expect(formatSi(v, unit)).toBe(out));
});

// Check values and limits as the workspace and the report show them (hand-written: SI prefixes per
// the SI Brochure, BIPM, 9th edition, table 7; unprefixed units print as plain numbers).
describe.each([
  [1.54e-8, 's', '15.4 ns'],
  [0.00000111, 's', '1.11 µs'],
  [0.0012, 'A', '1.2 mA'],
  [2200, 'ns', '2.2 µs'],
  [0.000943, 'J', '943 µJ'],
  [0.045, 'Ω', '45 mΩ'],
  [24, 'V', '24 V'],
  [0, 'A', '0 A'],
  [0.000943, 'A²s', '9.43 × 10⁻⁴ A²s'],
  [0.0421, 'A²s', '0.0421 A²s'],
  [1.5, 'K/W', '1.5 K/W'],
  [61.2, '°C', '61.2 °C'],
  [null, 'V', '—'],
  [Number.NaN, 'A', '—'],
] as const)('measure(%s, %s)', (value, unit, expected) => {
  it(`reads ${expected}`, () => expect(measure(value, unit)).toBe(expected));
});

describe.each([
  [0.000943, '9.43 × 10⁻⁴'],
  [-0.0000152, '-1.52 × 10⁻⁵'],
  [12300000, '1.23 × 10⁷'],
] as const)('scientific(%s)', (value, expected) => {
  it(`reads ${expected}`, () => expect(scientific(value)).toBe(expected));
});

// The duty error is a dimensionless fraction: it reads as a percentage (hand-written).
describe.each([
  [0.00063, '', '0.063 %'],
  [0.01, '', '1 %'],
  [1.54e-8, 's', '15.4 ns'],
  [null, '', '—'],
] as const)('checkFigure(%s, %s)', (value, unit, expected) => {
  it(`reads ${expected}`, () => expect(checkFigure(value, unit)).toBe(expected));
});

describe('counted: the noun agrees with the count (English grammar)', () => {
  it.each([
    [1, 'diode', 'diodes', '1 diode'],
    [0, 'diode', 'diodes', '0 diodes'],
    [4, 'person', 'people', '4 people'],
    [1, 'person', 'people', '1 person'],
    [25412, 'MOSFET', 'MOSFETs', '25,412 MOSFETs'],
  ])('%d %s', (n, one, many, text) => {
    expect(counted(n, one, many)).toBe(text);
  });
});

describe('count (thousands separated by commas, common practice in English)', () => {
  it.each([
    [0, '0'],
    [999, '999'],
    [1240, '1,240'],
    [1_000_000, '1,000,000'],
    [-12_500, '-12,500'],
    [NaN, '—'],
    [null, '—'],
  ])('%s → %s', (value, expected) => expect(count(value)).toBe(expected));
});

describe('age (rounded down to the unit shown)', () => {
  it.each([
    [0, 'just now'],
    [59_999, 'just now'],
    [60_000, '1 min ago'],
    [59 * 60_000 + 59_000, '59 min ago'],
    [3 * 3_600_000 + 20 * 60_000, '3 h ago'], // 3 h 20 min
    [47 * 3_600_000, '47 h ago'],
    [48 * 3_600_000, '2 days ago'],
    [-5_000, 'just now'], // a clock a little ahead
  ])('%i ms → %s', (ms, expected) => expect(age(ms)).toBe(expected));
});

describe('bound: chip numbers, hand-written', () => {
  it.each([
    [30, 'V', '30 V'],
    [2.5, 'V', '2.5 V'],
    [0.01, 'Ω', '10 mΩ'],
    [0.0045, 'Ω', '4.5 mΩ'],
    [0.5, 'A', '500 mA'],
    [1234, 'V', '1.23 kV'],
    [0, 'V', '0 V'],
    [Number.NaN, 'V', '— V'],
  ])('bound(%d, %s) → %s', (value, unit, text) => {
    expect(bound(value, unit)).toBe(text);
  });
});

describe('prefixFactor: SI prefixes as typed', () => {
  it.each([
    ['', 1],
    ['m', 1e-3],
    ['µ', 1e-6],
    ['u', 1e-6],
    ['k', 1e3],
  ])('%s → %d', (prefix, factor) => {
    expect(prefixFactor(prefix)).toBe(factor);
  });
  it('an unknown prefix has no factor', () => {
    expect(prefixFactor('x')).toBeUndefined();
  });
});
