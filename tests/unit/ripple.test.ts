import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { MotorModel } from '../../src/lib/motor.ts';
import { rippleExactA } from '../../src/lib/pwm.ts';
import {
  MIN_PERIODS_PER_TAU,
  periodicCurrent,
  pwmFrequencyCaution,
  rippleOperatingPoint,
  simulatePeriodicCurrent,
  solveBackEmfForMeanCurrentV,
  type RippleInput,
  type RippleResult,
} from '../../src/lib/ripple.ts';

const CURRENT_KEYS = [
  'meanA',
  'motorRmsA',
  'switchRmsA',
  'switchMeanA',
  'diodeMeanA',
  'diodeRmsA',
  'turnOnA',
  'turnOffA',
  'peakA',
  'rippleA',
] as const;

/**
 * Closed form and simulation agree within `relative` of the current scale max(peak, V/R) and 1e-6 of the
 * period in zeroFraction. Measured worst case over 1000 random cases: 2.7e-6 of that scale (a 0.3 % duty
 * with only 14 RK4 steps on), 1.3e-7 in zeroFraction; so 1e-5 is the stated tolerance.
 */
function expectAgreement(exact: RippleResult, simulated: RippleResult, input: RippleInput, relative = 1e-5): void {
  const scaleA = Math.max(exact.peakA, input.supplyV / input.resistanceOhm);
  expect(simulated.continuous).toBe(exact.continuous);
  for (const key of CURRENT_KEYS) expect(Math.abs(simulated[key] - exact[key]), key).toBeLessThanOrEqual(relative * scaleA);
  expect(Math.abs(simulated.zeroFraction - exact.zeroFraction)).toBeLessThanOrEqual(1e-6);
}

/** Hand derivation from the two ODEs: in continuous conduction the motor voltage swings from +V to −VF, so ΔI = ((V + VF)/R)(1 − a)(1 − b)/(1 − ab). */
function handRippleA(v: number, vf: number, r: number, l: number, d: number, f: number): number {
  const periodsPerTau = (f * l) / r;
  const a = Math.exp(-d / periodsPerTau);
  const b = Math.exp(-(1 - d) / periodsPerTau);
  return (((v + vf) / r) * (1 - a) * (1 - b)) / (1 - a * b);
}

/** Hand derivation: the continuous fixed point i1 = Aon(1 − a) + a·i0, i0 = Aoff(1 − b) + b·i1, Aon = (V − E)/R, Aoff = −(VF + E)/R. */
function handContinuousA(input: RippleInput): { turnOnA: number; turnOffA: number } {
  const tauS = input.inductanceH / input.resistanceOhm;
  const a = Math.exp(-input.duty / (input.frequencyHz * tauS));
  const b = Math.exp(-(1 - input.duty) / (input.frequencyHz * tauS));
  const onA = (input.supplyV - input.backEmfV) / input.resistanceOhm;
  const offA = -(input.diodeForwardV + input.backEmfV) / input.resistanceOhm;
  const turnOffA = (onA * (1 - a) + a * offA * (1 - b)) / (1 - a * b);
  return { turnOnA: offA * (1 - b) + b * turnOffA, turnOffA };
}

// docs/engineering.md "Ripple and discontinuous conduction" (worked example, checked by simulation and closed form)
const WORKED = { supplyV: 12.6, resistanceOhm: 2.4, inductanceH: 1.2e-3, diodeForwardV: 0.7, duty: 0.5 };
const WORKED_MEAN_A = 0.745;

describe('worked example, 1 kHz: discontinuous', () => {
  const base = { ...WORKED, frequencyHz: 1000 };
  const { backEmfV, result } = solveBackEmfForMeanCurrentV(base, WORKED_MEAN_A);

  it.each([
    ['backEmfV', backEmfV, 5.7, 0.005], // docs/engineering.md "Ripple and discontinuous conduction": E ≈ 5.70 V
    ['peakA', result.peakA, 1.818, 0.0005], // same worked example: peak 1.818 A at turn-off
    ['turnOffA', result.turnOffA, 1.818, 0.0005], // same worked example: the peak is the turn-off current
    ['zeroFraction', result.zeroFraction, 0.24, 0.005], // same worked example: zero for 24 % of the period
    ['switchRmsA', result.switchRmsA, 0.834, 0.0005], // same worked example: switch I_rms = 0.834 A
  ])('%s ≈ %d', (_name, value, expected, tolerance) => {
    expect(Math.abs(value - expected)).toBeLessThanOrEqual(tolerance);
  });

  it('is discontinuous, and the hand formulas for a period started from zero give the same peak and zero time', () => {
    expect(result.continuous).toBe(false); // same worked example
    expect(result.turnOnA).toBe(0);
    const tauS = 1.2e-3 / 2.4; // τe = L/R = 0.5 ms (worked example)
    const peakA = ((12.6 - backEmfV) / 2.4) * (1 - Math.exp(-0.5e-3 / tauS)); // on from zero: (V−E)/R·(1 − e^(−DT/τ))
    const conductS = tauS * Math.log(1 + (peakA * 2.4) / (0.7 + backEmfV)); // off: decays toward −(VF+E)/R, zero after τ·ln(1 + i·R/(VF+E))
    expect(result.peakA).toBeCloseTo(peakA, 12);
    expect(result.zeroFraction).toBeCloseTo((0.5e-3 - conductS) / 1e-3, 12);
  });

  it('I·√D would give 0.527 A: the true switch RMS makes the conduction loss about 2.5 times larger', () => {
    const naiveRmsA = WORKED_MEAN_A * Math.sqrt(0.5); // docs/engineering.md §4: switch I_rms = I·√D without ripple
    expect(naiveRmsA).toBeCloseTo(0.527, 3); // worked example: I·√D gives 0.527 A
    expect((result.switchRmsA / naiveRmsA) ** 2).toBeCloseTo(2.5, 1); // worked example: conduction loss ×2.5
  });

  it('the simulation, solved for the same mean current by its own bisection, lands on the same E', () => {
    let low = 0;
    let high = 12.6;
    for (let k = 0; k < 40; k += 1) {
      const mid = (low + high) / 2;
      if (simulatePeriodicCurrent({ ...base, backEmfV: mid }).meanA > WORKED_MEAN_A) low = mid;
      else high = mid;
    }
    expect(Math.abs((low + high) / 2 - backEmfV)).toBeLessThan(1e-4); // second method
  });
});

describe('worked example, 20 kHz: continuous, the mean-voltage model holds', () => {
  const base = { ...WORKED, frequencyHz: 20000 };
  const { backEmfV, result } = solveBackEmfForMeanCurrentV(base, WORKED_MEAN_A);
  const meanVoltageEmfV = 0.5 * 12.6 - 0.5 * 0.7 - WORKED_MEAN_A * 2.4; // docs/engineering.md §4: D·V − (1−D)·VF − I·R = 4.162 V
  const rippleA = handRippleA(12.6, 0.7, 2.4, 1.2e-3, 0.5, 20000); // hand derivation above

  it.each([
    ['backEmfV', backEmfV, meanVoltageEmfV, 1e-9], // docs/engineering.md §4 mean-voltage model, exact in continuous conduction
    ['backEmfV', backEmfV, 4.16, 0.005], // docs/engineering.md "Ripple and discontinuous conduction": E ≈ 4.16 V
    ['switchRmsA', result.switchRmsA, 0.528, 0.0005], // same worked example: I_rms = 0.528 A
    // docs/engineering.md §4: D·(I² + ΔI²/12) treats the ripple as a triangle about the mean; the exponential on-segment
    // sits slightly above the period mean, so it is a close approximation (0.4 mA here), not an identity.
    ['switchRmsA', result.switchRmsA, Math.sqrt(0.5 * (WORKED_MEAN_A ** 2 + rippleA ** 2 / 12)), 6e-4],
    // At D = 0.5 the fixed point gives i1 − Ī = ΔI/2 exactly (hand derivation: i1 = (Aon + a·Aoff)/(1 + a), Ī = (Aon + Aoff)/2).
    ['peakA', result.peakA, WORKED_MEAN_A + rippleA / 2, 1e-9],
    // The worked example states 0.815 A; both methods give 0.8143 A, so the stated figure is about 0.7 mA high.
    ['peakA', result.peakA, 0.815, 0.001],
  ])('%s ≈ %d', (_name, value, expected, tolerance) => {
    expect(Math.abs(value - expected)).toBeLessThanOrEqual(tolerance);
  });

  it('is continuous and runs slower than at 1 kHz (E 4.16 V against 5.70 V)', () => {
    expect(result.continuous).toBe(true); // worked example
    expect(result.zeroFraction).toBe(0);
    expect(backEmfV).toBeLessThan(solveBackEmfForMeanCurrentV({ ...WORKED, frequencyHz: 1000 }, WORKED_MEAN_A).backEmfV);
  });
});

// Hand-picked cases: continuous and discontinuous, several f, D, E; the simulation is the second method.
describe.each<[string, RippleInput]>([
  [
    'CCM f·τe 10, D 0.3',
    { supplyV: 12, resistanceOhm: 2, inductanceH: 1e-3, diodeForwardV: 0.5, duty: 0.3, frequencyHz: 20000, backEmfV: 3 },
  ],
  [
    'CCM f·τe 2.5, D 0.7',
    { supplyV: 24, resistanceOhm: 1, inductanceH: 0.5e-3, diodeForwardV: 0.8, duty: 0.7, frequencyHz: 5000, backEmfV: 10 },
  ],
  [
    'CCM no diode drop, E 0 (docs/engineering.md §4 M1 at 1 kHz)',
    { supplyV: 3, resistanceOhm: 3 / 1.8, inductanceH: 0.15e-3, diodeForwardV: 0, duty: 0.5, frequencyHz: 1000, backEmfV: 0 },
  ],
  [
    'DCM f·τe 0.5, D 0.2',
    { supplyV: 12, resistanceOhm: 2.4, inductanceH: 1.2e-3, diodeForwardV: 0.7, duty: 0.2, frequencyHz: 1000, backEmfV: 6 },
  ],
  [
    'DCM light load f·τe 5',
    { supplyV: 12, resistanceOhm: 2, inductanceH: 1e-3, diodeForwardV: 0.4, duty: 0.5, frequencyHz: 10000, backEmfV: 5.5 },
  ],
  [
    'DCM f·τe 0.1, D 0.8',
    { supplyV: 6, resistanceOhm: 4, inductanceH: 0.2e-3, diodeForwardV: 0.3, duty: 0.8, frequencyHz: 2000, backEmfV: 1 },
  ],
  ['duty 1: DC', { supplyV: 12, resistanceOhm: 2, inductanceH: 1e-3, diodeForwardV: 0.5, duty: 1, frequencyHz: 5000, backEmfV: 4 }],
  ['duty 0', { supplyV: 12, resistanceOhm: 2, inductanceH: 1e-3, diodeForwardV: 0.5, duty: 0, frequencyHz: 5000, backEmfV: 4 }],
  ['V below E', { supplyV: 5, resistanceOhm: 2, inductanceH: 1e-3, diodeForwardV: 0.5, duty: 0.6, frequencyHz: 5000, backEmfV: 6 }],
])('closed form against simulation: %s', (name, input) => {
  it('agree within 1e-5 of the current scale', () => {
    expectAgreement(periodicCurrent(input), simulatePeriodicCurrent(input), input);
  });

  it('the mode in the name is the one the hand fixed point gives (continuous iff its turn-on current is positive)', () => {
    if (name.startsWith('CCM')) expect(handContinuousA(input).turnOnA).toBeGreaterThan(0);
    if (name.startsWith('DCM')) expect(handContinuousA(input).turnOnA).toBeLessThanOrEqual(0);
    if (/^(CCM|DCM)/.test(name)) expect(periodicCurrent(input).continuous).toBe(name.startsWith('CCM'));
  });
});

const M1_R = 3 / 1.8; // docs/engineering.md §2 M1: R = V/Is
describe('docs/engineering.md §4 examples: M1, L 0.15 mH, 3 V, D 0.5, E 0, VF 0 (the diode loop never reaches zero: continuous)', () => {
  it.each([
    [1000, 1.786], // docs/engineering.md §4 example [calc]
    [5000, 0.908], // docs/engineering.md §4 example [calc]
    [20000, 0.2484], // docs/engineering.md §4 example [calc]
  ])('%d Hz → ΔI %d A', (f, expected) => {
    const r = periodicCurrent({
      supplyV: 3,
      resistanceOhm: M1_R,
      inductanceH: 0.15e-3,
      diodeForwardV: 0,
      duty: 0.5,
      frequencyHz: f,
      backEmfV: 0,
    });
    expect(r.continuous).toBe(true);
    expect(r.rippleA).toBeCloseTo(expected, 3);
    expect(r.rippleA).toBeCloseTo(handRippleA(3, 0, M1_R, 0.15e-3, 0.5, f), 12); // re-derived by the hand formula
    expect(r.meanA).toBeCloseTo(0.9, 9); // docs/engineering.md §4: stalled at D = 0.5, mean 0.9 A (1.5 V / R)
    // docs/engineering.md §4's diode 0.45 A is (1−D)·I for a flat current. With E = VF = 0 the off current decays
    // from i1 to i0 = b·i1 with nothing else driving it, so by hand its mean is f·τe·(i1 − i0) = f·τe·ΔI.
    expect(r.diodeMeanA).toBeCloseTo(f * (0.15e-3 / M1_R) * expected, 3);
  });
});

describe('continuous ripple does not depend on E and matches pwm.ts', () => {
  it.each([0, 1, 2.5, 4])('E %d V: ΔI equals rippleExactA with VF 0, and with (V + VF) when VF > 0', (backEmfV) => {
    const base = { supplyV: 12, resistanceOhm: 2, inductanceH: 1e-3, duty: 0.4, frequencyHz: 10000, backEmfV };
    const noDrop = periodicCurrent({ ...base, diodeForwardV: 0 });
    const withDrop = periodicCurrent({ ...base, diodeForwardV: 0.7 });
    expect(noDrop.continuous && withDrop.continuous).toBe(true);
    expect(noDrop.rippleA).toBeCloseTo(rippleExactA(12, 2, 1e-3, 0.4, 10000), 12); // docs/engineering.md §4 formula (src/lib/pwm.ts)
    expect(withDrop.rippleA).toBeCloseTo(rippleExactA(12.7, 2, 1e-3, 0.4, 10000), 12); // hand derivation: swing V + VF
  });
});

describe('limits', () => {
  it.each([100, 1000, 1e5])('f·τe %d ≫ 1: ΔI → V·D(1 − D)/(L·f)', (periodsPerTau) => {
    const l = 1e-3;
    const f = (periodsPerTau * 2) / l;
    const r = periodicCurrent({ supplyV: 12, resistanceOhm: 2, inductanceH: l, diodeForwardV: 0, duty: 0.3, frequencyHz: f, backEmfV: 2 });
    const approxA = (12 * 0.3 * 0.7) / (l * f); // docs/engineering.md §4: ΔI ≈ V·D(1−D)/(L·f) for f·τe ≫ 1
    expect(Math.abs(r.rippleA / approxA - 1)).toBeLessThan(1 / periodsPerTau ** 2); // series expansion: the error is O(1/(f·τe)²)
    expect(r.continuous).toBe(true);
    expect(r.meanA).toBeCloseTo((0.3 * 12 - 2) / 2, 9); // docs/engineering.md §4 mean-voltage model, exact in continuous conduction: (D·V − E)/R
  });

  it('duty 1 is DC: (V − E)/R, no ripple, all through the switch', () => {
    const r = periodicCurrent({
      supplyV: 12,
      resistanceOhm: 2,
      inductanceH: 1e-3,
      diodeForwardV: 0.7,
      duty: 1,
      frequencyHz: 5000,
      backEmfV: 4,
    });
    expect(r.meanA).toBeCloseTo(4, 12); // Ohm's law: (12 − 4)/2
    expect(r.switchRmsA).toBeCloseTo(4, 12);
    expect(r.rippleA).toBeCloseTo(0, 12);
    expect(r.diodeMeanA).toBe(0);
    expect(r.continuous).toBe(true);
  });

  it.each<[string, Partial<RippleInput>]>([
    ['duty 0', { duty: 0 }],
    ['V = E', { backEmfV: 12 }],
    ['V < E', { backEmfV: 13 }],
  ])('%s: no current at all', (_name, change) => {
    const r = periodicCurrent({
      supplyV: 12,
      resistanceOhm: 2,
      inductanceH: 1e-3,
      diodeForwardV: 0.7,
      duty: 0.5,
      frequencyHz: 5000,
      backEmfV: 4,
      ...change,
    });
    for (const key of CURRENT_KEYS) expect(r[key], key).toBe(0);
    expect(r.zeroFraction).toBe(1);
    expect(r.continuous).toBe(false);
  });

  it.each<[string, Partial<RippleInput>]>([
    ['resistanceOhm', { resistanceOhm: 0 }],
    ['inductanceH', { inductanceH: -1 }],
    ['frequencyHz', { frequencyHz: Number.NaN }],
    ['duty', { duty: 1.2 }],
    ['backEmfV', { backEmfV: -1 }],
  ])('bad %s is refused with its name', (field, change) => {
    const input = {
      supplyV: 12,
      resistanceOhm: 2,
      inductanceH: 1e-3,
      diodeForwardV: 0.7,
      duty: 0.5,
      frequencyHz: 5000,
      backEmfV: 4,
      ...change,
    };
    expect(() => periodicCurrent(input)).toThrow(field);
  });
});

describe('back-EMF for a mean current', () => {
  const base = { ...WORKED, frequencyHz: 1000 };

  it('a target above the E = 0 current stalls the motor: E = 0', () => {
    const stalledA = periodicCurrent({ ...base, backEmfV: 0 }).meanA;
    const { backEmfV, result } = solveBackEmfForMeanCurrentV(base, stalledA * 1.5);
    expect(backEmfV).toBe(0); // brief: the motor stalls at that duty
    expect(result.meanA).toBeCloseTo(stalledA, 12);
  });

  it('a target of zero needs no current: E = V', () => {
    expect(solveBackEmfForMeanCurrentV(base, 0).backEmfV).toBe(12.6);
  });
});

// Invented motor for the motor-level call: 2.2 Ω winding + 0.2 Ω series = the worked example's 2.4 Ω loop.
const MOTOR: MotorModel = {
  ratedVoltageV: 12,
  resistanceOhm: 2.2,
  keVsPerRad: 0.01,
  ktNmPerA: 0.01,
  noLoadCurrentA: 0.1,
  frictionTorqueNm: 0.001,
};
const AT = { model: MOTOR, supplyV: 12.6, duty: 0.5, diodeForwardV: 0.7, seriesResistanceOhm: 0.2, inductanceH: 1.2e-3 };
const RPM_PER_RAD_S = 30 / Math.PI; // docs/engineering.md §1: 1 rpm = π/30 rad/s

describe('rippleOperatingPoint', () => {
  it('torque load: mean current I0 + T/Kt, so the worked example again (E ≈ 5.70 V at 1 kHz)', () => {
    const torqueNm = (0.745 - 0.1) * 0.01; // docs/engineering.md §2: I = I0 + T/Kt → T = (0.745 − 0.1)·Kt
    const p = rippleOperatingPoint({ ...AT, frequencyHz: 1000, load: { kind: 'torque', torqueNm } });
    expect(p.ripple.meanA).toBeCloseTo(0.745, 9);
    expect(Math.abs(p.backEmfV - 5.7)).toBeLessThan(0.005); // docs/engineering.md "Ripple and discontinuous conduction"
    expect(p.speedRpm).toBeCloseTo((p.backEmfV / 0.01) * RPM_PER_RAD_S, 9); // docs/engineering.md §2: ω = E/Ke
  });

  it.each<[string, { kind: 'speed'; speedRpm: number } | { kind: 'stall-only' }, number]>([
    ['speed 3000 rpm', { kind: 'speed', speedRpm: 3000 }, (0.01 * 3000) / RPM_PER_RAD_S], // docs/engineering.md §2: E = Ke·ω
    ['stall-only', { kind: 'stall-only' }, 0], // stalled: ω = 0
  ])('%s at 20 kHz: E from the load, mean current from the mean-voltage model', (_name, load, backEmfV) => {
    const p = rippleOperatingPoint({ ...AT, frequencyHz: 20000, load });
    expect(p.backEmfV).toBeCloseTo(backEmfV, 12);
    expect(p.ripple.continuous).toBe(true);
    expect(p.ripple.meanA).toBeCloseTo((0.5 * 12.6 - 0.5 * 0.7 - backEmfV) / 2.4, 9); // docs/engineering.md §4, exact in continuous conduction
  });

  it('a negative speed is refused with the field named', () => {
    expect(() => rippleOperatingPoint({ ...AT, frequencyHz: 20000, load: { kind: 'speed', speedRpm: -10 } })).toThrow('load.speedRpm');
  });
});

describe('PWM frequency caution', () => {
  it.each<[number, number, boolean]>([
    [1000, 0.5e-3, true], // worked example at 1 kHz: f·τe 0.5, discontinuous
    [9800, 0.5e-3, true], // f·τe 4.9, just below the threshold
    [10000, 0.5e-3, false], // f·τe 5: at the threshold
    [20000, 0.5e-3, false], // worked example at 20 kHz: f·τe 10, continuous
    [1000, 0, false], // τe unknown: nothing to judge
  ])('%d Hz, τe %d s → caution %s', (f, tauS, cautioned) => {
    const text = pwmFrequencyCaution(f, tauS);
    expect(text !== null).toBe(cautioned);
    if (text) {
      expect(text).toContain('discontinuous');
      expect(text).toContain(`${MIN_PERIODS_PER_TAU / tauS / 1000} kHz`); // the frequency that reaches the threshold, 5/τe
      expect(text).toContain('18–25 kHz'); // docs/engineering.md §4: above hearing [practice]
    }
  });

  it('the threshold f·τe = 5 keeps the D = 0.5 ripple near 5 % of stall current, so a 3 % load stays continuous and 2 % does not', () => {
    const l = 1e-3;
    const input = {
      supplyV: 12,
      resistanceOhm: 2,
      inductanceH: l,
      diodeForwardV: 0,
      duty: 0.5,
      frequencyHz: (MIN_PERIODS_PER_TAU * 2) / l,
    };
    expect(handRippleA(12, 0, 2, l, 0.5, input.frequencyHz) / 6).toBeCloseTo(0.05, 3); // docs/engineering.md §4 formula: (1 − a)/(1 + a), a = e^(−0.1)
    expect(solveBackEmfForMeanCurrentV(input, 0.03 * 6).result.continuous).toBe(true); // mean above ΔI/2 (2.5 % of V/R)
    expect(solveBackEmfForMeanCurrentV(input, 0.02 * 6).result.continuous).toBe(false); // mean below ΔI/2
  });
});

const num = (min: number, max: number): fc.Arbitrary<number> => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
/** Random drives: L from a chosen f·τe so both modes and both sides of the caution appear. */
const rippleInputs = (minPeriodsPerTau: number, maxPeriodsPerTau: number): fc.Arbitrary<RippleInput> =>
  fc
    .record({
      supplyV: num(1, 48),
      resistanceOhm: num(0.05, 20),
      periodsPerTau: num(minPeriodsPerTau, maxPeriodsPerTau),
      diodeForwardV: num(0, 1),
      duty: num(0, 1),
      emfFraction: num(0, 1.1),
      frequencyHz: num(100, 100000),
    })
    .map(({ periodsPerTau, emfFraction, ...c }) => ({
      ...c,
      inductanceH: (periodsPerTau * c.resistanceOhm) / c.frequencyHz,
      backEmfV: emfFraction * c.supplyV,
    }));

describe('properties', () => {
  it('closed form and simulation agree (1e-5 of the current scale) for random drives, f·τe 0.05 to 30', () => {
    fc.assert(
      fc.property(rippleInputs(0.05, 30), (input) => expectAgreement(periodicCurrent(input), simulatePeriodicCurrent(input), input)),
      {
        numRuns: 60,
      },
    );
  });

  it('outputs are finite and hang together (RMS partition, means, bounds, the volt-second balance), f·τe 1e-4 to 1e4', () => {
    fc.assert(
      fc.property(rippleInputs(1e-4, 1e4), (input) => {
        const r = periodicCurrent(input);
        for (const value of Object.values(r)) expect(Number.isFinite(value) || typeof value === 'boolean').toBe(true);
        const slackA = 1e-9 * Math.max(r.peakA, 1e-12);
        expect(r.switchRmsA ** 2 + r.diodeRmsA ** 2).toBeCloseTo(r.motorRmsA ** 2, 9); // the intervals split the period
        expect(Math.abs(r.switchMeanA + r.diodeMeanA - r.meanA)).toBeLessThanOrEqual(slackA);
        expect(r.meanA).toBeLessThanOrEqual(r.motorRmsA + slackA); // RMS ≥ mean
        expect(r.motorRmsA).toBeLessThanOrEqual(r.peakA + slackA); // RMS ≤ peak
        expect(r.switchRmsA).toBeLessThanOrEqual(r.motorRmsA + slackA);
        expect(r.turnOnA).toBeLessThanOrEqual(r.turnOffA + slackA);
        expect(r.zeroFraction >= 0 && r.zeroFraction <= 1).toBe(true);
        if (!r.continuous) expect(r.turnOnA).toBe(0);
        if (r.continuous) {
          const { supplyV, diodeForwardV, resistanceOhm, inductanceH, duty, frequencyHz } = input;
          expect(r.rippleA).toBeCloseTo(handRippleA(supplyV, diodeForwardV, resistanceOhm, inductanceH, duty, frequencyHz), 9);
          const hand = handContinuousA(input);
          const scaleA = Math.max(r.peakA, (supplyV + diodeForwardV) / resistanceOhm);
          expect(Math.abs(r.turnOnA - hand.turnOnA)).toBeLessThanOrEqual(1e-9 * scaleA);
          expect(Math.abs(r.turnOffA - hand.turnOffA)).toBeLessThanOrEqual(1e-9 * scaleA);
        }
        if (input.duty > 0 && input.supplyV > input.backEmfV) {
          // Mean of L·di/dt over a period is zero: R·Ī = D·(V − E) − (1 − D − z)·(VF + E) (hand derivation from the ODEs)
          const balanceA =
            (input.duty * (input.supplyV - input.backEmfV) - (1 - input.duty - r.zeroFraction) * (input.diodeForwardV + input.backEmfV)) /
            input.resistanceOhm;
          expect(Math.abs(r.meanA - balanceA)).toBeLessThanOrEqual(
            1e-8 * Math.max(r.peakA, (input.supplyV + input.diodeForwardV) / input.resistanceOhm),
          );
        }
      }),
      { numRuns: 300 },
    );
  });

  it('the mean current falls as E rises, and the solver hits any target below the stall current', () => {
    fc.assert(
      fc.property(rippleInputs(0.01, 100), num(0, 1), num(0, 1), (input, f1, f2) => {
        const [lo, hi] = [Math.min(f1, f2), Math.max(f1, f2)].map((k) => k * input.supplyV);
        expect(periodicCurrent({ ...input, backEmfV: hi }).meanA).toBeLessThanOrEqual(
          periodicCurrent({ ...input, backEmfV: lo }).meanA + 1e-12,
        );
        const { backEmfV: _ignored, ...base } = input;
        const targetA = f1 * periodicCurrent({ ...input, backEmfV: 0 }).meanA;
        const solved = solveBackEmfForMeanCurrentV(base, targetA);
        expect(solved.backEmfV >= 0 && solved.backEmfV <= input.supplyV).toBe(true);
        expect(Math.abs(solved.result.meanA - targetA)).toBeLessThanOrEqual((1e-9 * input.supplyV) / input.resistanceOhm);
      }),
      { numRuns: 100 },
    );
  });
});
