import { describe, expect, it } from 'vitest';
import { openInputOutput } from '../../src/lib/driver-input.ts';

// Hand-written truth table. Source: the definition of a buffer and an inverter (common practice): a
// non-inverting stage copies its input level, an inverting one outputs the complement; an internal
// pull-up holds an open input high, a pull-down low, and with no pull the open input is undefined.
describe('output with the input open, from the input pull and the polarity', () => {
  it.each([
    ['down', false, 'low'],
    ['down', true, 'high'], // the reset-start trap of an inverting driver
    ['up', false, 'high'],
    ['up', true, 'low'],
    ['none', false, 'undefined'],
    ['none', true, 'undefined'],
  ] as const)('pull %s, inverting %s → output %s', (pull, inverting, expected) => {
    expect(openInputOutput(pull, inverting)).toBe(expected);
  });
});
