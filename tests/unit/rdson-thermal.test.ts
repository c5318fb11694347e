import { describe, expect, it } from 'vitest';
import { lowestSpecVgsV, rdsOnAtDriveOhm, rdsOnAtTemperatureOhm, rdsOnPointsAt25C } from '../../src/lib/rdson.ts';
import { junctionFromLossC, maxCurrentAtAmbientA, solveConductionJunction } from '../../src/lib/thermal.ts';

const POINTS = [
  { vgsV: 2.5, ohms: 0.08 },
  { vgsV: 4.5, ohms: 0.05 },
  { vgsV: 10, ohms: 0.035 },
];

describe('RDS(on) at a drive voltage (log-space interpolation, docs/engineering.md §5)', () => {
  it.each([
    [2.5, 0.08], // spec point
    [4.5, 0.05], // spec point
    [10, 0.035], // spec point
    [12, 0.035], // above the top point: no extrapolated gain (conservative)
    [3.5, Math.sqrt(0.08 * 0.05)], // midpoint in VGS → geometric mean of the neighbours, re-derived
    [7.25, Math.sqrt(0.05 * 0.035)], // midpoint in VGS → geometric mean, re-derived
    [5, 0.05 * Math.pow(0.035 / 0.05, 0.5 / 5.5)], // R1·(R2/R1)^t, re-derived with pow
  ])('VGS %d V → %d Ω', (vgs, ohms) => {
    expect(rdsOnAtDriveOhm(POINTS, vgs)).toBeCloseTo(ohms, 12);
  });

  it('is null below the lowest spec point (not characterised)', () => {
    expect(rdsOnAtDriveOhm(POINTS, 2.4)).toBeNull(); // docs/engineering.md §5: unusable below the lowest spec VGS
    expect(lowestSpecVgsV(POINTS)).toBe(2.5);
    expect(rdsOnAtDriveOhm([], 5)).toBeNull();
  });

  it('refers hot spec points back to 25 °C and prefers 25 °C points', () => {
    const converted = rdsOnPointsAt25C([
      { vgsV: 4.5, tjC: 25, maxOhm: 0.05, typOhm: null, idA: null },
      { vgsV: 4.5, tjC: 125, maxOhm: 0.08, typOhm: null, idA: null },
      { vgsV: 10, tjC: 125, maxOhm: 0.06, typOhm: null, idA: null },
    ]);
    expect(converted).toEqual([
      { vgsV: 4.5, ohms: 0.05, testCurrentA: null },
      { vgsV: 10, ohms: 0.06 / 1.5, testCurrentA: null }, // docs/engineering.md §5.6: RDS(on)(Tj) = RDS25·(1 + 0.005·100)
    ]);
  });

  it('rises with temperature: ×1.625 at 150 °C with α = 0.005', () => {
    expect(rdsOnAtTemperatureOhm(0.05, 150)).toBeCloseTo(0.05 * 1.625, 12); // docs/engineering.md §5 [mem: ×1.4–1.8]
  });
});

/** Independent solver: fixed-point iteration Tj ← TA + RθJA·(I²·RDS25·(1 + α(Tj − 25)) + P_other). */
function iterateJunctionC(ambientC: number, rth: number, currentA: number, r25: number, alpha: number, otherW = 0): number {
  let tj = ambientC;
  for (let k = 0; k < 10000; k += 1) tj = ambientC + rth * (currentA ** 2 * r25 * (1 + alpha * (tj - 25)) + otherW);
  return tj;
}

describe('conduction junction temperature, closed form', () => {
  it('docs/engineering.md §5 example: TA 25, RθJA 250, 1.8 A, 0.05 Ω, α 0.005 → 75.78 °C, 0.2031 W', () => {
    const r = solveConductionJunction({ ambientC: 25, rthJaCPerW: 250, currentRmsA: 1.8, rdsOn25Ohm: 0.05, alphaPerC: 0.005 });
    expect(r.junctionC).toBeCloseTo(iterateJunctionC(25, 250, 1.8, 0.05, 0.005), 9); // iterative fixed point
    expect(r.junctionC).toBeCloseTo(75.78, 2); // docs/engineering.md §5 example [calc]
    expect(r.conductionLossW).toBeCloseTo(0.2031, 4); // docs/engineering.md §5 example [calc]
    expect(junctionFromLossC(25, r.conductionLossW as number, 250)).toBeCloseTo(r.junctionC as number, 9); // Tj = TA + P·Rθ
  });

  it.each([
    [40, 160, 1.2, 0.04, 0.005, 0.05], // invented case, with switching loss
    [85, 62, 3, 0.02, 0.004, 0], // invented case
    [-20, 300, 0.5, 0.3, 0.006, 0.01], // invented case
  ])('TA %d, Rθ %d, I %d, R %d, α %d, P_sw %d: matches the iteration', (ta, rth, i, r, a, pw) => {
    const r1 = solveConductionJunction({ ambientC: ta, rthJaCPerW: rth, currentRmsA: i, rdsOn25Ohm: r, alphaPerC: a, otherLossW: pw });
    expect(r1.junctionC).toBeCloseTo(iterateJunctionC(ta, rth, i, r, a, pw), 8); // iterative fixed point
  });

  it('detects thermal runaway when k·α ≥ 1', () => {
    // k = 250·4²·0.05 = 200, k·α = 1 (docs/engineering.md §5)
    const r = solveConductionJunction({ ambientC: 25, rthJaCPerW: 250, currentRmsA: 4, rdsOn25Ohm: 0.05, alphaPerC: 0.005 });
    expect(r.runaway).toBe(true);
    expect(r.junctionC).toBeNull();
  });

  it('ID(TA) brings the junction exactly to Tj,max', () => {
    const idA = maxCurrentAtAmbientA(150, 40, 250, rdsOnAtTemperatureOhm(0.05, 150));
    // docs/engineering.md §5 [calc]: at ID(TA), Tj = TA + Rθ·I²·RDS(Tj,max) = Tj,max
    expect(40 + 250 * idA ** 2 * rdsOnAtTemperatureOhm(0.05, 150)).toBeCloseTo(150, 9);
    expect(solveConductionJunction({ ambientC: 40, rthJaCPerW: 250, currentRmsA: idA, rdsOn25Ohm: 0.05 }).junctionC).toBeCloseTo(150, 9);
  });
});
