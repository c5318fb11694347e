import { all, create } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  checkConsistency,
  motorAtSupply,
  motorModelFromDatasheet,
  stallCurrentAtWindingA,
  windingResistanceOhm,
  type MotorDatasheetPoints,
} from '../../src/lib/motor.ts';
import { maxEfficiencyPoint, maxPowerPoint, motorCurve, operatingPointAtSpeed, operatingPointAtTorque } from '../../src/lib/motor-curve.ts';

const math = create(all);
math.createUnit('gf', { definition: math.multiply(math.unit(1, 'g'), math.gravity).toString() });
math.createUnit('rpm', '1 cycle/minute');
const gcmToNm = (gcm: number): number => math.unit(gcm, 'gf cm').toNumber('N m'); // mathjs cross-check
const nmToGcm = (nm: number): number => math.unit(nm, 'N m').toNumber('gf cm'); // mathjs cross-check
const rpmToRad = (rpm: number): number => math.unit(rpm, 'rpm').toNumber('rad/s'); // mathjs cross-check

/** docs/engineering.md §2 worked example M1 (invented). */
const M1: MotorDatasheetPoints = {
  ratedVoltageV: 3,
  noLoadSpeedRpm: 12000,
  noLoadCurrentA: 0.2,
  stallCurrentA: 1.8,
  stallTorqueNm: 0.0033953,
};

/** Independent re-derivation of M1's constants from the power balance at no load: V·I0 = I0²R + Ke·ω0·I0. */
const m1R = M1.ratedVoltageV / M1.stallCurrentA;
const m1Ke = (M1.ratedVoltageV - M1.noLoadCurrentA * m1R) / rpmToRad(M1.noLoadSpeedRpm);

describe('M1 model constants', () => {
  const model = motorModelFromDatasheet(M1);
  it.each([
    ['resistanceOhm', model.resistanceOhm, 1.6667, 4], // docs/engineering.md §2 M1 [calc], re-derived: 3 V / 1.8 A
    ['keVsPerRad', model.keVsPerRad, 2.12207e-3, 8], // docs/engineering.md §2 M1 [calc]
    ['ktNmPerA', model.ktNmPerA, m1Ke, 12], // Kt = Ke in SI (docs/engineering.md §2)
    ['frictionTorqueNm', model.frictionTorqueNm, m1Ke * 0.2, 12], // T_f = Kt·I0 (docs/engineering.md §2)
  ] as const)('%s', (_name, actual, expected, digits) => {
    expect(actual).toBeCloseTo(expected, digits);
  });

  it('predicts Ts = 3.39531 mN·m = 34.62 g·cm', () => {
    const ts = motorAtSupply(model, 3).stallTorqueNm;
    expect(ts).toBeCloseTo(m1Ke * (1.8 - 0.2), 12); // Ts = Kt·(Is − I0), re-derived
    expect(ts * 1000).toBeCloseTo(3.39531, 4); // docs/engineering.md §2 M1 [calc]
    expect(nmToGcm(ts)).toBeCloseTo(34.62, 2); // docs/engineering.md §2 M1 [calc], via mathjs
  });
});

describe('M1 curve table', () => {
  const at = motorAtSupply(motorModelFromDatasheet(M1), 3);
  // docs/engineering.md §2 M1 table [calc]; each row re-derived: I from T/Kt + I0, ω from V = I·R + Ke·ω, η = T·ω/(V·I)
  it.each([[0], [0.84883e-3], [1.69765e-3], [3.39531e-3]])('T = %d N·m', (torqueNm) => {
    const p = operatingPointAtTorque(at, torqueNm);
    const currentA = 0.2 + torqueNm / m1Ke;
    const speedRad = Math.max(0, (3 - currentA * m1R) / m1Ke);
    expect(p.currentA).toBeCloseTo(currentA, 4);
    expect(rpmToRad(p.speedRpm)).toBeCloseTo(speedRad, 1);
    expect(p.powerW).toBeCloseTo(torqueNm * speedRad, 3);
    expect(p.efficiency).toBeCloseTo((torqueNm * speedRad) / (3 * currentA), 3);
  });

  it.each([
    ['max power', maxPowerPoint(at), 6000, 1.0, 1.0667], // docs/engineering.md §2 M1 [calc]: P_max = Ts·ω0/4
    ['max efficiency', maxEfficiencyPoint(at), 9000, 0.6, 0.8], // docs/engineering.md §2 M1 [calc]: I = √(I0·Is)
  ] as const)('%s point', (_name, p, speedRpm, currentA, powerW) => {
    expect(p.speedRpm).toBeCloseTo(speedRpm, 6);
    expect(p.currentA).toBeCloseTo(currentA, 9);
    expect(p.powerW).toBeCloseTo(powerW, 4);
  });

  it('η_max = (1 − √(I0/Is))² = 0.4444', () => {
    expect(maxEfficiencyPoint(at).efficiency).toBeCloseTo((1 - Math.sqrt(0.2 / 1.8)) ** 2, 12); // docs/engineering.md §2
    expect(maxEfficiencyPoint(at).efficiency).toBeCloseTo(0.4444, 4); // docs/engineering.md §2 M1 [calc]
  });

  it('P_max = Ts·ω0/4', () => {
    expect(maxPowerPoint(at).powerW).toBeCloseTo((at.stallTorqueNm * rpmToRad(12000)) / 4, 10); // docs/engineering.md §2
  });

  it('curve spans 0…Ts with the requested number of points', () => {
    const curve = motorCurve(at, 21);
    expect(curve).toHaveLength(21);
    expect(curve[0].speedRpm).toBeCloseTo(12000, 6); // docs/engineering.md §2 M1 no-load
    expect(curve[20].currentA).toBeCloseTo(1.8, 9); // docs/engineering.md §2 M1 stall
  });
});

describe('M1 re-scaled', () => {
  const model = motorModelFromDatasheet(M1);
  it('to 4.5 V: Is 2.70 A, n0 18 750 rpm, Ts 54.10 g·cm', () => {
    const at = motorAtSupply(model, 4.5);
    expect(at.stallCurrentA).toBeCloseTo(4.5 / m1R, 10); // Is′ = V′/R, re-derived
    expect(at.stallCurrentA).toBeCloseTo(2.7, 10); // docs/engineering.md §2 M1 [calc]
    // n0 scales with the back-EMF share: n0′ = n0·(V′ − I0·R)/(V − I0·R), re-derived
    expect(at.noLoadSpeedRpm).toBeCloseTo((12000 * (4.5 - 0.2 * m1R)) / (3 - 0.2 * m1R), 6);
    expect(at.noLoadSpeedRpm).toBeCloseTo(18750, 6); // docs/engineering.md §2 M1 [calc]
    expect(nmToGcm(at.stallTorqueNm)).toBeCloseTo(54.1, 2); // docs/engineering.md §2 M1 [calc], via mathjs
  });

  it('to 3 V with 0.1 Ω in series: Is 1.698 A', () => {
    expect(motorAtSupply(model, 3, 0.1).stallCurrentA).toBeCloseTo(3 / (m1R + 0.1), 12); // re-derived
    expect(motorAtSupply(model, 3, 0.1).stallCurrentA).toBeCloseTo(1.698, 3); // docs/engineering.md §2 M1 [calc]
  });
});

describe('consistency check', () => {
  it.each([
    [34.62, 1.0, false], // docs/engineering.md §2 M1 [calc]: self-consistent
    [60, 1.733, true], // docs/engineering.md §2 M1 with Ts = 60 g·cm [calc]: must warn
  ] as const)('Ts = %d g·cm → ratio ≈ %d', (gcm, ratio, warns) => {
    const points = { ...M1, stallTorqueNm: gcmToNm(gcm) };
    const c = checkConsistency(points, motorModelFromDatasheet(points));
    expect(c.torqueRatio).toBeCloseTo(gcmToNm(gcm) / (m1Ke * 1.6), 9); // re-derived Ts_pred = Kt·(Is − I0)
    expect(c.torqueRatio).toBeCloseTo(ratio, 2);
    expect(c.warning != null).toBe(warns);
  });
});

describe('common practice: small 3 V motor, 12 800 rpm at 0.32 A, max efficiency 10 000 rpm at 1.28 A', () => {
  // common practice: Is recovered from I_maxeff = √(I0·Is) → Is = 1.28²/0.32 = 5.12 A
  const isA = 1.28 ** 2 / 0.32;
  const points: MotorDatasheetPoints = {
    ratedVoltageV: 3,
    noLoadSpeedRpm: 12800,
    noLoadCurrentA: 0.32,
    stallCurrentA: isA,
    stallTorqueNm: gcmToNm(80),
  };
  const model = motorModelFromDatasheet(points);

  it('Is = 5.12 A', () => expect(isA).toBeCloseTo(5.12, 12)); // common practice example

  it('puts the max-efficiency point within 5 % of 10 000 rpm at 1.28 A', () => {
    const p = maxEfficiencyPoint(motorAtSupply(model, 3));
    expect(p.currentA).toBeCloseTo(1.28, 9); // common practice example
    expect(Math.abs(p.speedRpm - 10000) / 10000).toBeLessThan(0.05); // common practice: within 5 %
  });

  it('warns with a rated 80 g·cm stall torque (ratio ≈ 0.78)', () => {
    const c = checkConsistency(points, model);
    const keIndependent = (3 - 0.32 * (3 / isA)) / rpmToRad(12800); // re-derived
    expect(c.torqueRatio).toBeCloseTo(gcmToNm(80) / (keIndependent * (isA - 0.32)), 9);
    expect(c.torqueRatio).toBeCloseTo(0.78, 2); // common practice example
    expect(c.warning).toMatch(/lower/);
  });
});

describe('measured terminal resistance and cold winding', () => {
  it('uses a measured resistance instead of V/Is', () => {
    const model = motorModelFromDatasheet({ ...M1, terminalResistanceOhm: 1.5 });
    expect(model.resistanceOhm).toBe(1.5); // override
    expect(model.keVsPerRad).toBeCloseTo((3 - 0.2 * 1.5) / rpmToRad(12000), 12); // docs/engineering.md §2 Ke formula
  });

  it.each([
    [20, 1], // IEC 60028: reference temperature
    [-10, 1 - 0.00393 * 30], // IEC 60028 α20 = 0.00393/K
    [75, 1 + 0.00393 * 55], // IEC 60028 α20 = 0.00393/K
  ])('R(%d °C) = R20 × %d', (tempC, factor) => {
    expect(windingResistanceOhm(2, tempC)).toBeCloseTo(2 * factor, 12);
  });

  it('cold winding raises the stall current at the highest supply', () => {
    const model = motorModelFromDatasheet(M1);
    const coldA = stallCurrentAtWindingA(model, 3.3, -10);
    expect(coldA).toBeCloseTo(3.3 / (m1R * (1 - 0.00393 * 30)), 10); // IEC 60028 α20, docs/engineering.md §2
    expect(coldA).toBeGreaterThan(3.3 / m1R);
  });

  it('rejects points that cannot describe a motor', () => {
    expect(() => motorModelFromDatasheet({ ...M1, noLoadCurrentA: 2 })).toThrow(RangeError); // I0 ≥ Is
  });
});

describe('operating points', () => {
  const at = motorAtSupply(motorModelFromDatasheet(M1), 3);
  it('at a speed reproduces the torque that gives it', () => {
    const p = operatingPointAtSpeed(at, 9000);
    expect(p.torqueNm).toBeCloseTo(0.84883e-3, 7); // docs/engineering.md §2 M1 table [calc]
  });
  it('stalls when the load exceeds the stall torque', () => {
    const p = operatingPointAtTorque(at, 0.01);
    expect(p.stalled).toBe(true);
    expect(p.currentA).toBeCloseTo(1.8, 9); // docs/engineering.md §2 M1 stall current
    expect(p.speedRpm).toBe(0);
  });
});
