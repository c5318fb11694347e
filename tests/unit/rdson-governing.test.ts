/**
 * The governing RDS(on) line per VGS interval. Expected intervals written out by hand from the rule in
 * README "Searching the catalogue": at a drive V the 25 °C line at the highest VGS not above V governs;
 * lines at other temperatures never do; below the lowest 25 °C line nothing does.
 */
import { describe, expect, it } from 'vitest';
import { governingMaxOhmAt, governingRdsOnIntervals } from '../../src/lib/rdson-governing.ts';
import type { RdsOnSpecPoint } from '../../src/lib/domain/parts.ts';

const line = (vgsV: number, maxOhm: number, tjC = 25): RdsOnSpecPoint => ({ vgsV, tjC, maxOhm, typOhm: null, idA: null });

describe('governingRdsOnIntervals', () => {
  it.each([
    ['one line: open interval from its VGS', [line(10, 0.01)], [{ vgsFromV: 10, vgsToV: null, maxOhm: 0.01 }]],
    [
      'lines given out of order are sorted by VGS',
      [line(10, 0.02), line(4.5, 0.03)],
      [
        { vgsFromV: 4.5, vgsToV: 10, maxOhm: 0.03 },
        { vgsFromV: 10, vgsToV: null, maxOhm: 0.02 },
      ],
    ],
    [
      'a 125 °C line is left out; 24 °C and 26 °C count as 25 °C',
      [line(2.5, 0.05, 24), line(4.5, 0.025, 26), line(10, 0.005, 125)],
      [
        { vgsFromV: 2.5, vgsToV: 4.5, maxOhm: 0.05 },
        { vgsFromV: 4.5, vgsToV: null, maxOhm: 0.025 },
      ],
    ],
    [
      'two 25 °C lines at one VGS: the lower maximum',
      [line(4.5, 0.03, 24), line(4.5, 0.02, 25)],
      [{ vgsFromV: 4.5, vgsToV: null, maxOhm: 0.02 }],
    ],
    ['only hot lines: no interval', [line(10, 0.02, 100)], []],
  ] as const)('%s', (_name, points, expected) => {
    expect(governingRdsOnIntervals([...points])).toEqual(expected);
  });
});

describe('governingMaxOhmAt', () => {
  const intervals = governingRdsOnIntervals([line(1.8, 0.04), line(2.5, 0.024), line(4.5, 0.012), line(10, 0.004, 125)]);
  it.each([
    [1.5, null], // below the lowest line: not characterised
    [1.8, 0.04], // at a line: that line
    [2.49, 0.04], // just below the next line: still the lower one
    [2.5, 0.024],
    [3.3, 0.024],
    [4.5, 0.012],
    [5, 0.012],
    [10, 0.012], // the 125 °C line at 10 V never governs
  ])('at %s V → %s Ω', (driveV, expected) => {
    expect(governingMaxOhmAt(intervals, driveV)).toBe(expected);
  });
});
