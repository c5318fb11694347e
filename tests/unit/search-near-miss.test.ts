/**
 * Near misses of a search with nothing found, on hand-built parts (tests/unit/fixtures.ts): which bounds
 * each part misses, in practitioner units, and the order (smallest worst relative miss first). The
 * expectations are worked out by hand beside each case from the fixture values.
 */
import { describe, expect, it } from 'vitest';
import { searchNearMisses } from '../../src/lib/search-near-miss.ts';
import { diodePart, mosfetPart } from './fixtures.ts';

describe('searchNearMisses for MOSFETs: RDS(on) ≤ 60 mΩ at 4.5 V and VDS ≥ 40 V', () => {
  // A: 4.5 V line 85 mΩ, VDS 40 V → misses RDS(on) by (85 − 60)/60 = 41.7 %.
  // B: 4.5 V line 50 mΩ, VDS 30 V → misses VDS by (40 − 30)/40 = 25 %.
  // C: lines at 2.5 V (70 mΩ) and 10 V (20 mΩ): at 4.5 V the 2.5 V line governs (70 mΩ, 16.7 %), VDS 60 V holds.
  // D: only a 10 V line: not characterised at 4.5 V (counts as far).
  const parts = [
    mosfetPart(1, 'A-85', { vdsMaxV: 40, rdsOn: [{ vgsV: 4.5, tjC: 25, maxOhm: 0.085, typOhm: 0.07, idA: 2 }] }),
    mosfetPart(2, 'B-30V', { vdsMaxV: 30, rdsOn: [{ vgsV: 4.5, tjC: 25, maxOhm: 0.05, typOhm: 0.04, idA: 2 }] }),
    mosfetPart(3, 'C-70', {
      vdsMaxV: 60,
      rdsOn: [
        { vgsV: 2.5, tjC: 25, maxOhm: 0.07, typOhm: 0.06, idA: 1 },
        { vgsV: 10, tjC: 25, maxOhm: 0.02, typOhm: 0.015, idA: 3 },
      ],
    }),
    mosfetPart(4, 'D-10V', { vdsMaxV: 60, rdsOn: [{ vgsV: 10, tjC: 25, maxOhm: 0.01, typOhm: 0.008, idA: 5 }] }),
  ];
  const bounds = { rdsOnMaxOhm: 0.06, rdsOnAtVgsV: 4.5, vdsMinV: 40 };

  it('orders C, B, A, D and says what each misses', () => {
    const near = searchNearMisses(parts, bounds, 4);
    expect(near.map((n) => n.mpn)).toEqual(['C-70', 'B-30V', 'A-85', 'D-10V']);
    expect(near[0].worstShortfall).toBeCloseTo(1 / 6, 9);
    expect(near[1].worstShortfall).toBeCloseTo(0.25, 9);
    expect(near[2].worstShortfall).toBeCloseTo(25 / 60, 9);
    expect(near[2].misses).toEqual(['RDS(on) at 4.5 V 85 mΩ, needs ≤ 60 mΩ']);
    expect(near[1].misses).toEqual(['VDS max 30 V, needs ≥ 40 V']);
    expect(near[0].misses).toEqual(['RDS(on) at 4.5 V 70 mΩ, needs ≤ 60 mΩ']);
    expect(near[3].misses).toEqual(['RDS(on) at 4.5 V not characterised, needs ≤ 60 mΩ']);
  });

  it('a part meeting every bound is not a near miss; no numeric bound, no hint', () => {
    const ok = mosfetPart(5, 'E-OK', { vdsMaxV: 60, rdsOn: [{ vgsV: 4.5, tjC: 25, maxOhm: 0.04, typOhm: 0.03, idA: 2 }] });
    expect(searchNearMisses([ok], bounds)).toEqual([]);
    expect(searchNearMisses(parts, {})).toEqual([]);
  });
});

describe('searchNearMisses for diodes: VRRM ≥ 60 V and trr ≤ 50 ns', () => {
  it('a Schottky without trr meets the trr bound (the list’s rule); VRRM 40 V misses by 33 %', () => {
    // (60 − 40)/60 = 0.333; the ultrafast part: VRRM 100 V holds, trr 75 ns misses by (75 − 50)/50 = 50 %.
    const near = searchNearMisses(
      [diodePart(1, 'S-40', { vrrmV: 40, trrNs: null }), diodePart(2, 'U-75', { kind: 'ultrafast', vrrmV: 100, trrNs: 75 })],
      { vrrmMinV: 60, trrMaxNs: 50 },
    );
    expect(near.map((n) => [n.mpn, n.misses])).toEqual([
      ['S-40', ['VRRM 40 V, needs ≥ 60 V']],
      ['U-75', ['trr 75 ns, needs ≤ 50 ns']],
    ]);
    expect(near[0].worstShortfall).toBeCloseTo(1 / 3, 9);
  });
});
