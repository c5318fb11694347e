/**
 * Compare and near-miss wording on hand-built checks: which way a limit binds (read from the margin),
 * values in the units people read (hand-written table), and the closest candidates when nothing passes
 * (hand-ordered by the rule: marginal before failing, fewest misses, smallest relative distance).
 */
import { describe, expect, it } from 'vitest';
import { checkQuantity, checkVerdict, limitSense, nearMissLine, nearMisses, needsText, compareCheck } from '../../src/lib/compare.ts';
import { marginAbove, marginBelow, type Check } from '../../src/lib/checks.ts';

const check = (
  id: string,
  value: number | null,
  limit: number | null,
  unit: string,
  sense: 'below' | 'above',
  ok: boolean,
  severity?: 'hard' | 'margin',
): Check => ({
  id,
  ok,
  value,
  limit,
  unit,
  margin: value == null || limit == null ? null : sense === 'below' ? marginBelow(value, limit) : marginAbove(value, limit),
  note: `${id} note`,
  ...(ok ? {} : { severity: severity ?? 'hard' }),
});

describe('checkQuantity: SI values in practitioner units (hand-written table)', () => {
  it.each([
    [0.085, 'Ω', '', '85 mΩ'],
    [0.06, 'Ω', '', '60 mΩ'],
    [1.54e-8, 's', '', '15.4 ns'],
    [0.00000111, 's', '', '1.11 µs'],
    [0.0123, 'A', '', '12.3 mA'],
    [1.5, 'A', '', '1.5 A'],
    [25.7, 'V', '', '25.7 V'],
    [15.4, 'ns', '', '15.4 ns'],
    [2200, 'ns', '', '2.2 µs'],
    [0.00063, '', 'duty-error', '0.063 %'],
    [0.01, '', 'duty-error', '1 %'],
    [162.4, '°C', '', '162 °C'],
    [0.000943, 'A²s', '', '9.43 × 10⁻⁴ A²s'],
    [null, 'V', '', '—'],
  ])('%s %s (%s) → %s', (value, unit, id, text) => {
    expect(checkQuantity(value, unit)).toBe(text); // id names the row only
  });
});

describe('limitSense and needsText', () => {
  it('an upper limit (value must stay at or below) reads ≤, a lower one ≥', () => {
    const rds = compareCheck(check('rdson', 0.085, 0.06, 'Ω', 'below', false));
    expect(rds.sense).toBe('at-most');
    expect(needsText(rds)).toBe('needs ≤ 60 mΩ');
    const high = compareCheck(check('output-high', 2.9, 4.5, 'V', 'above', false));
    expect(high.sense).toBe('at-least');
    expect(needsText(high)).toBe('needs ≥ 4.5 V');
    // Holding checks read the same way: 20 V ≤ 24 V, 11 V ≥ 4.5 V.
    expect(limitSense(check('drain-voltage', 20, 24, 'V', 'below', true))).toBe('at-most');
    expect(limitSense(check('gate-drive', 11, 4.5, 'V', 'above', true))).toBe('at-least');
    expect(limitSense(check('channel', null, null, '', 'below', false))).toBeNull();
  });

  it('verdict per check: holds → pass, margin only → marginal, broken → fail', () => {
    expect(checkVerdict({ ok: true })).toBe('pass');
    expect(checkVerdict({ ok: false, severity: 'margin' })).toBe('marginal');
    expect(checkVerdict({ ok: false, severity: 'hard' })).toBe('fail');
  });
});

describe('nearMisses on a hand-built list with nothing passing', () => {
  // Hand-built: A misses one limit by 42 % (85 vs 60 mΩ), B one limit by 10 % (132 vs 120 °C), C two limits
  // by 1.7 % (6 vs 5.9 A) and 0.8 % (121 vs 120 °C), D a wrong channel (no numbers, counts as far).
  // Expected order by the rule (smallest worst distance first): C, B, A; D last.
  const list = [
    {
      partId: 1,
      mpn: 'A-1',
      verdict: 'fail' as const,
      checks: [check('rdson', 0.085, 0.06, 'Ω', 'below', false), check('drain-voltage', 20, 24, 'V', 'below', true)],
    },
    { partId: 2, mpn: 'B-2', verdict: 'fail' as const, checks: [check('junction-temperature', 132, 120, '°C', 'below', false)] },
    {
      partId: 3,
      mpn: 'C-3',
      verdict: 'fail' as const,
      checks: [check('stall-current', 6, 5.9, 'A', 'below', false), check('junction-temperature', 121, 120, '°C', 'below', false)],
    },
    { partId: 4, mpn: 'D-4', verdict: 'fail' as const, checks: [check('channel', null, null, '', 'below', false)] },
  ];

  it('orders the closest first and says what each misses', () => {
    const near = nearMisses(list, 3);
    expect(near.map((n) => n.mpn)).toEqual(['C-3', 'B-2', 'A-1']);
    // (6 − 5.9)/5.9 = 0.016949; (132 − 120)/120 = 0.1; (0.085 − 0.06)/0.06 = 0.41667.
    expect(near[0].worstShortfall).toBeCloseTo(0.016949, 5);
    expect(near[1].worstShortfall).toBeCloseTo(0.1, 9);
    expect(near[2].worstShortfall).toBeCloseTo(0.416667, 5);
    expect(nearMissLine(near[2])).toBe('closest: A-1 — Rdson 85 mΩ, needs ≤ 60 mΩ');
    expect(nearMissLine(near[1])).toBe('closest: B-2 — Junction temperature, running 132 °C, needs ≤ 120 °C');
    expect(near[0].misses.map((m) => m.id)).toEqual(['stall-current', 'junction-temperature']);
    expect(nearMissLine(near[0])).toBe(
      'closest: C-3 — Stall current (pulse rating) 6 A, needs ≤ 5.9 A; Junction temperature, running 121 °C, needs ≤ 120 °C',
    );
    expect(nearMisses(list, 4)[3].misses[0].text).toBe('Channel type: channel note');
  });

  it('a marginal part comes before every failing one, listing the margins it eats into', () => {
    const withMarginal = [
      ...list,
      { partId: 5, mpn: 'E-5', verdict: 'marginal' as const, checks: [check('drain-voltage', 25.7, 24, 'V', 'below', false, 'margin')] },
    ];
    const near = nearMisses(withMarginal, 2);
    expect(near.map((n) => n.mpn)).toEqual(['E-5', 'C-3']);
    expect(near[0].misses[0].text).toBe('Drain voltage rating 25.7 V, needs ≤ 24 V');
  });

  it('nothing to hint when a part passes, or the list is empty', () => {
    expect(nearMisses([...list, { partId: 6, mpn: 'F-6', verdict: 'pass' as const, checks: [] }])).toEqual([]);
    expect(nearMisses([])).toEqual([]);
  });
});
