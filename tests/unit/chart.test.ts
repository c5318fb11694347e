import { describe, expect, it } from 'vitest';
import { linearScale, niceStep, niceTicks, tickLabel } from '../../src/lib/chart.ts';

// Expected values worked by hand with Heckbert's nice-number rounding (P. Heckbert, "Nice numbers for graph
// labels", Graphics Gems, 1990: fraction < 1.5 → 1, < 3 → 2, < 7 → 5, else 10), from memory.
describe.each([
  { min: 0, max: 12000, count: 5, step: 2000 },
  { min: 0, max: 1.8, count: 5, step: 0.5 },
  { min: 0, max: 0.0034, count: 5, step: 0.0005 },
  { min: 0, max: 7, count: 5, step: 1 },
])('niceStep($min, $max)', ({ min, max, count, step }) => {
  it(`is ${step}`, () => expect(niceStep(min, max, count)).toBeCloseTo(step, 12));
});

describe('niceTicks', () => {
  it('widens the domain to whole steps and includes both ends', () => {
    const { ticks, domain } = niceTicks(0, 1.8);
    expect(domain).toEqual([0, 2]);
    expect(ticks).toEqual([0, 0.5, 1, 1.5, 2]);
  });
});

describe('linearScale', () => {
  it('maps the domain onto the range linearly (inverted axis for SVG y)', () => {
    const y = linearScale([0, 10], [200, 0]);
    expect(y(0)).toBe(200);
    expect(y(10)).toBe(0);
    expect(y(2.5)).toBe(150);
  });
});

describe.each([
  { v: 12000, label: '12k' },
  { v: 0.30000000000000004, label: '0.3' },
  { v: 1500, label: '1500' },
])('tickLabel($v)', ({ v, label }) => {
  it(`is ${label}`, () => expect(tickLabel(v)).toBe(label));
});
