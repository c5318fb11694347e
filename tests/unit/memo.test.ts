import { describe, expect, it } from 'vitest';
import { memoOnObject } from '../../src/lib/memo.ts';
import { worstCaseOf } from '../../src/lib/design-case.ts';
import { MOTOR_M1, caseM1 } from './fixtures.ts';

describe('memoOnObject: a value kept on its object', () => {
  it('works the value out once per object, and again for another object of the same content', () => {
    let calls = 0;
    const sumOf = memoOnObject((xs: number[]) => {
      calls++;
      return xs.reduce((a, b) => a + b, 0);
    });
    const a = [1, 2, 3];
    expect(sumOf(a)).toBe(6);
    expect(sumOf(a)).toBe(6);
    expect(calls).toBe(1);
    expect(sumOf([1, 2, 3])).toBe(6);
    expect(calls).toBe(2);
  });

  it('stays out of sight: JSON, keys, spreads and deep equality see the object as it was', () => {
    const lengthOf = memoOnObject((o: { name: string }) => o.name.length);
    const o = { name: 'INV-N30L' };
    expect(lengthOf(o)).toBe(8);
    expect(JSON.stringify(o)).toBe('{"name":"INV-N30L"}');
    expect(Object.keys(o)).toEqual(['name']);
    expect(Object.getOwnPropertySymbols({ ...o })).toEqual([]);
    expect(o).toStrictEqual({ name: 'INV-N30L' });
  });

  it('falls back to a side table for a frozen object (it cannot take a property)', () => {
    let calls = 0;
    const doubled = memoOnObject((o: { v: number }) => {
      calls++;
      return o.v * 2;
    });
    const frozen = Object.freeze({ v: 21 });
    expect(doubled(frozen)).toBe(42);
    expect(doubled(frozen)).toBe(42);
    expect(calls).toBe(1);
  });
});

describe('worstCaseOf: kept by the content of its case', () => {
  it('an equal case gives the same answer; a changed supply a different one (the stall current scales with it)', () => {
    const a = worstCaseOf(caseM1());
    const b = worstCaseOf(caseM1());
    expect(b).toStrictEqual(a);
    const higher = worstCaseOf(caseM1({ supplyMaxV: 6.6 }));
    // Stall current at the highest supply is V/R: twice the supply, twice the current (docs/engineering.md §2).
    expect(higher.stallCurrentMaxA).toBeCloseTo(2 * a.stallCurrentMaxA, 10);
  });

  it('the shared answer is frozen: a caller cannot change what the next one gets', () => {
    const wc = worstCaseOf(caseM1({ motor: { ...MOTOR_M1, inductanceH: null } }));
    expect(Object.isFrozen(wc)).toBe(true);
    expect(Object.isFrozen(wc.stall)).toBe(true);
    expect(() => {
      (wc as { supplyMaxV: number }).supplyMaxV = 99;
    }).toThrow(TypeError);
  });

  it('freezes only its own answer, nothing of the case it was given', () => {
    const c = caseM1({
      stallProtection: { kind: 'current-limit', limitA: 2 },
      drive: { mode: 'pwm', frequencyHz: 20_000, dutyMin: 0.2, dutyMax: 0.8 },
    });
    worstCaseOf(c);
    const frozen: string[] = [];
    const walk = (v: unknown, path: string): void => {
      if (v == null || typeof v !== 'object') return;
      if (Object.isFrozen(v)) frozen.push(path);
      for (const [k, x] of Object.entries(v)) walk(x, `${path}.${k}`);
    };
    walk(c, 'case');
    expect(frozen).toEqual([]);
  });

  it('tells non-finite numbers apart from null (JSON alone writes both as null)', () => {
    // Two cases whose plain JSON is the same: a limit of Infinity (no limit at all) and a limit of null.
    const noLimit = caseM1({ stallProtection: { kind: 'current-limit', limitA: Infinity } });
    const nullLimit = caseM1({ stallProtection: { kind: 'current-limit', limitA: null as unknown as number } });
    expect(JSON.stringify(noLimit)).toBe(JSON.stringify(nullLimit));
    const unlimited = worstCaseOf(noLimit);
    expect(unlimited.stall.currentA).toBeCloseTo(unlimited.stallCurrentMaxA, 10);
    // min(null, I) is 0 in JavaScript: a different answer, so it must not be the one kept for Infinity.
    expect(worstCaseOf(nullLimit).stall.currentA).toBe(0);
  });
});
