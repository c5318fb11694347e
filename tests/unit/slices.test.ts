/**
 * Work in slices (src/lib/slices.ts): the answer is items.map(f) whatever the slice size, and the work
 * pauses after every full slice except the last. Expected pause counts written by hand: ⌈n / size⌉ − 1.
 */
import { describe, expect, it } from 'vitest';
import { mapInSlices, runSteps } from '../../src/lib/slices.ts';

const square = (x: number) => x * x;

describe('mapInSlices', () => {
  it.each([
    // n, size, pauses
    [0, 1, 0],
    [1, 1, 0],
    [2, 1, 1],
    [10, 3, 3],
    [9, 3, 2],
    [10, 10, 0],
    [10, 11, 0],
    [2500, 1000, 2],
  ])('%i items in slices of %i pause %i times and give the map', (n, size, pauses) => {
    const items = Array.from({ length: n }, (_, i) => i);
    const steps = mapInSlices(items, square, size);
    let seen = 0;
    let r = steps.next();
    for (; !r.done; r = steps.next()) seen++;
    expect(seen).toBe(pauses);
    expect(r.value).toEqual(items.map(square));
  });

  it('judges nothing before it is run, and only one slice per step', () => {
    const judged: number[] = [];
    const steps = mapInSlices([1, 2, 3, 4, 5], (x) => (judged.push(x), x), 2);
    expect(judged).toEqual([]);
    steps.next();
    expect(judged).toEqual([1, 2]);
    steps.next();
    expect(judged).toEqual([1, 2, 3, 4]);
  });

  it('runSteps runs it through; a slice size below 1 is refused', () => {
    expect(runSteps(mapInSlices([3, 4], square, 1))).toEqual([9, 16]);
    expect(() => runSteps(mapInSlices([1], square, 0))).toThrow(RangeError);
    expect(() => runSteps(mapInSlices([1], square, Number.NaN))).toThrow(RangeError);
  });
});
