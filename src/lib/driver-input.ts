/**
 * A driver's input structure and what it means for the output while the input is left open: the pull
 * sets the input level, and the output is that level, inverted when the driver inverts. Pure.
 */
import type { DriverParams } from './domain/parts.ts';

export type OpenInputOutput = 'low' | 'high' | 'undefined';

/** Output level with the input open: no pull leaves it undefined; otherwise (pulled up) XOR inverting. */
export function openInputOutput(pull: DriverParams['inputPull'], inverting: boolean): OpenInputOutput {
  if (pull === 'none') return 'undefined';
  return (pull === 'up') !== inverting ? 'high' : 'low';
}

/** One line for forms and records: "With the input open the output is LOW" (or HIGH / undefined). */
export function openInputSentence(pull: DriverParams['inputPull'], inverting: boolean): string {
  const out = openInputOutput(pull, inverting);
  if (out === 'undefined') return 'With the input open the output is undefined (nothing holds the input: add an external pull).';
  return `With the input open the output is ${out.toUpperCase()} (input pulled ${pull}, ${inverting ? 'inverting' : 'non-inverting'}).`;
}
