/**
 * One worst-case figure for the current a pull resistor carries (docs/engineering.md §7.6): the ranking's
 * gate-drive budget and the power-on advice must both take I = V_rail/(R·(1 − tol)) for a recommended gate
 * pull-down, not one of them the nominal V_high/R. Expected values are Ohm's law worked by hand here.
 */
import { describe, expect, it } from 'vitest';
import { worstPullCurrentA } from '../../src/lib/pull-resistor.ts';
import { pullDrawCurrentA } from '../../src/lib/power-on.ts';
import { rankDesign } from '../../src/lib/rank-design.ts';
import { caseM1, mosfetPart } from './fixtures.ts';

describe('worstPullCurrentA (Ohm’s law at the low tolerance end)', () => {
  it.each([
    // across V, nominal Ω, tolerance, hand value: V / (R·(1 − tol))
    ['3.3 V across 10 kΩ ±1 %: 3.3 / 9900 = 1/3000 A', 3.3, 10_000, 0.01, 1 / 3000],
    ['3.3 V across 10 kΩ, no tolerance: 3.3 / 10000', 3.3, 10_000, 0, 0.00033],
    ['3.3 V across 4.7 kΩ ±1 %: 3.3 / 4653', 3.3, 4700, 0.01, 0.000709219858156028],
    ['−1.8 V across 27 kΩ ±5 %: 1.8 / 25650 (magnitude)', -1.8, 27_000, 0.05, 0.0000701754385964912],
  ])('%s', (_name, v, ohms, tol, expected) => {
    expect(worstPullCurrentA(v, ohms, tol)).toBeCloseTo(expected, 12);
  });

  it('is above the nominal V/R whenever there is a tolerance (the check can fail if the tolerance is dropped)', () => {
    expect(worstPullCurrentA(3.3, 10_000, 0.01)).toBeGreaterThan(3.3 / 10_000);
  });

  it('pullDrawCurrentA: a pull-down draws V/(R·(1 − tol)) while the pin is high; a pull-up or an unfitted pull draws nothing', () => {
    const base = {
      maxOhms: 10_000,
      minOhms: 1000,
      chosenOhms: 10_000,
      nodeV: 0.3,
      activeCurrentA: null,
      ok: true,
      notes: [],
      railV: 0,
      tolerance: 0.01,
    };
    expect(pullDrawCurrentA({ ...base, to: 'down' }, 3.3)).toBeCloseTo(1 / 3000, 12);
    expect(pullDrawCurrentA({ ...base, to: 'up', railV: 3.3 }, 3.3)).toBe(0);
    expect(pullDrawCurrentA({ ...base, to: 'down', ok: false, chosenOhms: null }, 3.3)).toBe(0);
  });
});

describe('ranking and power-on agree on a recommended gate pull-down’s draw', () => {
  it('direct drive from a pin with a 40 kΩ ±30 % reset pull-up: 4.7 kΩ pull-down, 3.3/(4700·0.99) A off the pin budget in both', () => {
    // Hand sizing (docs/engineering.md §9, pull resistor with tolerances): the gate must stay at or below
    // ½·VGS(th)min = 0.5 V (fixture part, VGS(th)min 1.0 V) against the pull-up at its strongest,
    // R_i = 40 kΩ·0.7 = 28 kΩ, with 1 µA leakage: R_e ≤ 28000·0.5/((3.3 − 0.5) + 1e-6·28000) = 4950.5 Ω,
    // at +1 %: 4901.5 Ω, E12 round-down (IEC 60063): 4.7 kΩ. The pin (8 mA) can drive it: ≥ 3.3/(0.008·0.99) = 417 Ω.
    const c = caseM1({
      logic: {
        highV: 3.1,
        lowV: 0.4,
        railV: 3.3,
        pinSourceCurrentA: 0.008,
        pinSinkCurrentA: 0.008,
        resetDefault: { pull: 'up', pullOhms: 40_000, pullTolerance: 0.3 },
      },
      stallProtection: { kind: 'current-limit', limitA: 1 },
    });
    const part = mosfetPart(1, 'INV-N30L');
    const ranking = rankDesign(c, { mosfets: [part], drivers: [], diodes: [] }, { switchId: 1 });
    const expectedDrawA = 3.3 / (4700 * 0.99); // 0.709220 mA, by hand: 3.3 / 4653
    expect(ranking.powerOn?.recommendedPull?.chosenOhms).toBe(4700);
    expect(ranking.switchDrive.by).toBe('pin');
    expect(ranking.powerOn?.pullDrawWhenHighA).toBeCloseTo(expectedDrawA, 12);
    expect(ranking.switchDrive.pullDownDrawA).toBeCloseTo(expectedDrawA, 12);
    // The nominal V_high/R (3.1/4700 = 0.6596 mA) is what the ranking used before: not accepted.
    expect(Math.abs(ranking.switchDrive.pullDownDrawA - 3.1 / 4700)).toBeGreaterThan(1e-5);
    expect(ranking.switchDrive.sourceCurrentA).toBeCloseTo(0.008 - expectedDrawA, 12);
  });
});
