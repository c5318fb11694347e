import { all, create } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  convertTorque,
  formatOhms,
  formatSi,
  radPerSToRpm,
  rpmToRadPerS,
  torqueFromNm,
  torqueToNm,
  type TorqueUnit,
} from '../../src/lib/units.ts';

// Independent reference: mathjs, with gram-force and ounce-force built from its own standard gravity
// (g_n = 9.80665 m/s², SI Brochure) and rpm from its 'cycle' unit; kgf is mathjs' built-in unit.
const math = create(all);
math.createUnit('gf', { definition: math.multiply(math.unit(1, 'g'), math.gravity).toString() });
math.createUnit('ozf', { definition: math.multiply(math.unit(1, 'oz'), math.gravity).toString() });
math.createUnit('rpm', '1 cycle/minute');

const MATHJS_TORQUE: Record<TorqueUnit, string> = {
  'N·m': 'N m',
  'mN·m': 'mN m',
  'g·cm': 'gf cm',
  'kgf·cm': 'kgf cm',
  'oz·in': 'ozf inch',
};

describe.each(Object.keys(MATHJS_TORQUE) as TorqueUnit[])('torque %s against mathjs', (unit) => {
  it.each([1, 0.0033953, 54.1, 1234.5])('%d %s to and from N·m', (value) => {
    const expectedNm = math.unit(value, MATHJS_TORQUE[unit]).toNumber('N m'); // mathjs cross-check
    expect(torqueToNm(value, unit)).toBeCloseTo(expectedNm, 12);
    expect(torqueFromNm(expectedNm, unit)).toBeCloseTo(value, 9);
  });
});

describe('torque reference values', () => {
  it.each([
    ['g·cm', 9.80665e-5], // docs/engineering.md §1, SI Brochure g_n exact
    ['oz·in', 7.0615518e-3], // docs/engineering.md §1
    ['kgf·cm', 9.80665e-2], // SI Brochure g_n exact
  ] as const)('1 %s = %d N·m', (unit, nm) => {
    expect(torqueToNm(1, unit)).toBeCloseTo(nm, 10);
  });

  it('converts between non-SI units via mathjs', () => {
    const expected = math.unit(100, 'gf cm').toNumber('ozf inch'); // mathjs cross-check
    expect(convertTorque(100, 'g·cm', 'oz·in')).toBeCloseTo(expected, 10);
  });
});

describe.each([1, 60, 12000, 18750])('speed %d rpm against mathjs', (rpm) => {
  it('rpm ↔ rad/s', () => {
    const radPerS = math.unit(rpm, 'rpm').toNumber('rad/s'); // mathjs cross-check
    expect(rpmToRadPerS(rpm)).toBeCloseTo(radPerS, 10);
    expect(radPerSToRpm(radPerS)).toBeCloseTo(rpm, 9);
  });
});

describe('formatSi', () => {
  it.each([
    [0.0033953, 'N·m', 3, '3.40 mN·m'], // brief's example
    [1256.637, 'rad/s', 4, '1.257 krad/s'], // SI prefixes, SI Brochure
    [0.2484, 'A', 3, '248 mA'], // SI prefixes
    [7.45e-3, 'W', 3, '7.45 mW'], // SI prefixes
    [141.8e-9, 's', 4, '141.8 ns'], // SI prefixes
    [2.2e-6, 'F', 2, '2.2 µF'], // SI prefixes (micro sign)
    [4.7e6, 'Ω', 2, '4.7 MΩ'], // SI prefixes
    [999.96, 'V', 3, '1.00 kV'], // rounding carries into the next prefix (common practice)
    [-0.05, 'A', 2, '-50 mA'], // sign kept
    [0, 'V', 3, '0.00 V'], // zero
    [3, 'V', 3, '3.00 V'], // no prefix
  ] as const)('formatSi(%d, %s, %d) = %s', (value, unit, digits, text) => {
    expect(formatSi(value, unit, digits)).toBe(text);
  });

  it('prints non-finite values as a dash', () => {
    expect(formatSi(Number.NaN, 'V', 3)).toBe('— V');
  });
});

// Resistor values written the way E-series values are printed (IEC 60063 lists 6.8, 68, 680 …).
describe.each([
  { ohm: 6800, text: '6.8 kΩ' },
  { ohm: 820, text: '820 Ω' },
  { ohm: 100000, text: '100 kΩ' },
  { ohm: 1000, text: '1 kΩ' },
])('formatOhms($ohm)', ({ ohm, text }) => {
  it(`is ${text}`, () => expect(formatOhms(ohm)).toBe(text));
});
