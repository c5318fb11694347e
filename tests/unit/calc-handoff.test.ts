/**
 * The calculators' refusal summary and the motor carried from the calculator into a new design. Expected
 * texts and values are written by hand here; the address format is the one /designs/new reads.
 */
import { describe, expect, it } from 'vitest';
import { localRefusal, refusalOf } from '../../src/components/calc/refusal.ts';
import { motorHandoffHref, readMotorHandoff } from '../../src/lib/motor-handoff.ts';

const PATHS = { 'motor.noLoadCurrentA': 'i0', 'motor.stallCurrentA': 'is' } as const;
const LABELS = { i0: 'No-load current', is: 'Stall current' } as const;

describe('refusalOf: fields named by their labels, never by API paths', () => {
  it.each([
    {
      issues: [{ path: 'motor.noLoadCurrentA', message: 'No-load current must be below the stall current' }],
      errors: { i0: 'No-load current must be below the stall current' },
      message: 'Check the marked field: No-load current.',
    },
    {
      issues: [
        { path: 'motor.stallCurrentA', message: 'too big' },
        { path: 'motor.noLoadCurrentA', message: 'first' },
        { path: 'motor.noLoadCurrentA', message: 'second' },
      ],
      errors: { is: 'too big', i0: 'first' },
      message: 'Check the marked fields: Stall current, No-load current.',
    },
    {
      issues: [
        { path: 'curvePoints', message: 'Too many curve points' },
        { path: 'curvePoints', message: 'Too many curve points' },
      ],
      errors: {},
      message: 'Too many curve points.',
    },
    { issues: [], errors: {}, message: 'The calculator could not use these inputs.' },
  ])('$message', ({ issues, errors, message }) => {
    const r = refusalOf(issues, PATHS, LABELS);
    expect(r.errors).toEqual(errors);
    expect(r.message).toBe(message);
    expect(r.message).not.toMatch(/motor\.|[a-z]+[A-Z][a-z]*A\b/);
  });

  it('summarises local errors the same way, and says nothing when there are none', () => {
    expect(localRefusal({ is: 'Enter a number.' }, LABELS).message).toBe('Check the marked field: Stall current.');
    expect(localRefusal({}, LABELS).message).toBe('');
  });
});

describe('motor handoff to /designs/new', () => {
  const motor = {
    ratedVoltageV: 3,
    noLoadSpeedRpm: 12000,
    noLoadCurrentA: 0.2,
    stallCurrentA: 1.8,
    stallTorqueNm: 0.0033953,
    supplyMinV: 2.4,
    supplyMaxV: 3.3,
  };
  const href = '/designs/new?ratedV=3&rpm=12000&i0A=0.2&isA=1.8&tsNm=0.0033953&vMin=2.4&vMax=3.3';

  it('writes the figures into the address in SI', () => {
    expect(motorHandoffHref(motor)).toBe(href);
    // 3.3953 mN·m converted by floating point carries a binary tail; the address does not.
    expect(motorHandoffHref({ ...motor, stallTorqueNm: 3.3953 * 0.001 })).toBe(href);
  });

  it('reads them back from the address', () => {
    expect(readMotorHandoff(new URL(href, 'http://x').searchParams)).toEqual(motor);
  });

  it.each([
    ['no figures at all', ''],
    ['a stall current below the no-load current', 'ratedV=3&rpm=12000&i0A=2&isA=1.8&tsNm=0.003&vMin=2.4&vMax=3.3'],
    ['a supply minimum above its maximum', 'ratedV=3&rpm=12000&i0A=0.2&isA=1.8&tsNm=0.003&vMin=4&vMax=3.3'],
    ['a figure that is not a number', 'ratedV=three&rpm=12000&i0A=0.2&isA=1.8&tsNm=0.003&vMin=2.4&vMax=3.3'],
    ['a missing figure', 'ratedV=3&rpm=12000&i0A=0.2&isA=1.8&vMin=2.4&vMax=3.3'],
    ['a supply above the design bound of 60 V', 'ratedV=3&rpm=12000&i0A=0.2&isA=1.8&tsNm=0.003&vMin=2.4&vMax=600'],
    ['an absurd voltage', 'ratedV=1e308&rpm=12000&i0A=0.2&isA=1.8&tsNm=0.003&vMin=2.4&vMax=3.3'],
  ])('ignores %s', (_what, query) => {
    expect(readMotorHandoff(new URLSearchParams(query))).toBeNull();
  });
});
