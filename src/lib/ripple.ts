/**
 * Motor current of a low-side PWM switch with a freewheel diode when the motor's inductance is known
 * [docs/engineering.md §4.3 "Ripple and discontinuous conduction"]. Per period T = 1/f, back-EMF E held constant
 * (the mechanical time constant is far longer than T):
 *   on  (0 ≤ t < D·T): L·di/dt = V − E − i·R
 *   off (D·T ≤ t < T): L·di/dt = −VF − E − i·R, clamped at i ≥ 0 (the diode stops at zero: discontinuous)
 * Only motoring current is modelled: with E ≥ V the current cannot rise and the result is zero (reverse
 * conduction of the switch, i.e. regeneration into the supply, is outside this model).
 */
import type { MotorModel } from './motor.ts';
import type { MotorLoad } from './pwm.ts';
import { radPerSToRpm, rpmToRadPerS, sig } from './units.ts';

export interface RippleInput {
  supplyV: number;
  /** Whole loop resistance: winding plus series (switch, wiring, shunt). */
  resistanceOhm: number;
  inductanceH: number;
  diodeForwardV: number;
  duty: number;
  frequencyHz: number;
  backEmfV: number;
}

export interface RippleResult {
  /** False when the current sits at zero for part of the period (or all of it). */
  continuous: boolean;
  meanA: number;
  motorRmsA: number;
  /** Over the whole period; the switch carries current in the on-interval only. */
  switchRmsA: number;
  switchMeanA: number;
  diodeMeanA: number;
  diodeRmsA: number;
  /** Current when the switch turns on; 0 in discontinuous conduction. */
  turnOnA: number;
  /** Current when the switch turns off: the peak, and the diode's repetitive peak. */
  turnOffA: number;
  peakA: number;
  /** Peak to peak. */
  rippleA: number;
  /** Fraction of the period with i = 0. */
  zeroFraction: number;
  tauS: number;
  /** f·τe: how many electrical time constants fit in one period. */
  periodsPerTau: number;
}

/** Throws a RangeError naming the field; a motoring drive has E ≥ 0 and non-negative VF. */
function validateRippleInput(input: RippleInput): void {
  const positive: (keyof RippleInput)[] = ['resistanceOhm', 'inductanceH', 'frequencyHz'];
  const nonNegative: (keyof RippleInput)[] = ['supplyV', 'diodeForwardV', 'backEmfV'];
  for (const key of positive) {
    if (!(Number.isFinite(input[key]) && input[key] > 0)) throw new RangeError(`${key} must be a positive finite number`);
  }
  for (const key of nonNegative) {
    if (!(Number.isFinite(input[key]) && input[key] >= 0)) throw new RangeError(`${key} must be a finite number ≥ 0`);
  }
  if (!(input.duty >= 0 && input.duty <= 1)) throw new RangeError('duty must lie in [0, 1]');
}

/** Σ_j c_j·(−x)^j/(j+n)!: the small-x series of the integrals below, where the direct forms cancel. */
function series(x: number, n: number, coefficient: (j: number) => number): number {
  let factorial = 1;
  for (let k = 2; k <= n; k += 1) factorial *= k;
  let power = 1 / factorial;
  let sum = 0;
  for (let j = 0; j < 40; j += 1) {
    sum += coefficient(j) * power;
    power *= -x / (j + n + 1);
  }
  return sum;
}

/** E1(x) = (1 − e^−x)/x. */
function e1(x: number): number {
  return x === 0 ? 1 : -Math.expm1(-x) / x;
}
/** E2(x) = (x − 1 + e^−x)/x² = ∫₀¹ (1 − e^−xu)/x du. */
function e2(x: number): number {
  return x < 1 ? series(x, 2, () => 1) : (x + Math.expm1(-x)) / (x * x);
}
/** F(x) = (E1(x) − E1(2x))/x = ∫₀¹ e^−xu·(1 − e^−xu)/x du. */
function crossTerm(x: number): number {
  return x < 1 ? series(x, 2, (j) => 2 ** (j + 1) - 1) : (e1(x) - e1(2 * x)) / x;
}
/** G(x) = (1 − 2·E1(x) + E1(2x))/x² = ∫₀¹ ((1 − e^−xu)/x)² du. */
function squareTerm(x: number): number {
  return x < 1 ? series(x, 3, (j) => 2 ** (j + 2) - 2) : (1 - 2 * e1(x) + e1(2 * x)) / (x * x);
}

interface Segment {
  endA: number;
  /** ∫ i dt over the segment (A·s). */
  chargeAs: number;
  /** ∫ i² dt over the segment (A²·s). */
  squareA2s: number;
}

/**
 * One exponential piece: i(t) = i_s·e^(−t/τ) + s·t·E1(t/τ), with s = drive voltage / L. Written with the
 * slope s rather than the asymptote s·τ so that it stays exact as f·τe grows (small R).
 */
function exponentialSegment(startA: number, slopeAPerS: number, durationS: number, tauS: number): Segment {
  const x = durationS / tauS;
  const rampA = slopeAPerS * durationS;
  return {
    endA: startA * Math.exp(-x) + rampA * e1(x),
    chargeAs: durationS * (startA * e1(x) + rampA * e2(x)),
    squareA2s: durationS * (startA ** 2 * e1(2 * x) + 2 * startA * rampA * crossTerm(x) + rampA ** 2 * squareTerm(x)),
  };
}

interface Waveform {
  on: Segment;
  off: Segment;
  turnOnA: number;
  turnOffA: number;
  zeroS: number;
  continuous: boolean;
}

/** Sums a waveform into the reported means and RMS values. */
function summarise(w: Waveform, input: RippleInput, tauS: number): RippleResult {
  const f = input.frequencyHz;
  const minA = w.continuous ? Math.min(w.turnOnA, w.turnOffA) : 0;
  const peakA = Math.max(w.turnOnA, w.turnOffA);
  return {
    continuous: w.continuous,
    meanA: (w.on.chargeAs + w.off.chargeAs) * f,
    motorRmsA: Math.sqrt(Math.max(0, (w.on.squareA2s + w.off.squareA2s) * f)),
    switchRmsA: Math.sqrt(Math.max(0, w.on.squareA2s * f)),
    switchMeanA: w.on.chargeAs * f,
    diodeMeanA: w.off.chargeAs * f,
    diodeRmsA: Math.sqrt(Math.max(0, w.off.squareA2s * f)),
    turnOnA: w.turnOnA,
    turnOffA: w.turnOffA,
    peakA,
    rippleA: peakA - minA,
    zeroFraction: Math.min(1, Math.max(0, w.zeroS * f)),
    tauS,
    periodsPerTau: f * tauS,
  };
}

const NO_SEGMENT: Segment = { endA: 0, chargeAs: 0, squareA2s: 0 };

/** Exact periodic steady state from the closed-form exponentials, continuous or discontinuous. */
export function periodicCurrent(input: RippleInput): RippleResult {
  validateRippleInput(input);
  const { supplyV: v, resistanceOhm: r, inductanceH: l, diodeForwardV: vf, duty: d, frequencyHz: f, backEmfV: e } = input;
  const tauS = l / r;
  const periodS = 1 / f;
  const onS = d * periodS;
  const offS = (1 - d) * periodS;
  if (onS <= 0 || v <= e) {
    return summarise({ on: NO_SEGMENT, off: NO_SEGMENT, turnOnA: 0, turnOffA: 0, zeroS: periodS, continuous: false }, input, tauS);
  }
  const onSlope = (v - e) / l;
  const offSlope = -(vf + e) / l;
  const riseFromZeroA = exponentialSegment(0, onSlope, onS, tauS).endA;
  const fallFromZeroA = exponentialSegment(0, offSlope, offS, tauS).endA;
  // Continuous fixed point: i1 = rise + a·i0, i0 = fall + b·i1 → i1 = (rise + a·fall)/(1 − a·b).
  const a = Math.exp(-onS / tauS);
  const b = Math.exp(-offS / tauS);
  const ccmTurnOffA = (riseFromZeroA + a * fallFromZeroA) / -Math.expm1(-periodS / tauS);
  const ccmTurnOnA = fallFromZeroA + b * ccmTurnOffA;
  if (ccmTurnOnA > 0) {
    const on = exponentialSegment(ccmTurnOnA, onSlope, onS, tauS);
    const off = exponentialSegment(ccmTurnOffA, offSlope, offS, tauS);
    return summarise({ on, off, turnOnA: ccmTurnOnA, turnOffA: ccmTurnOffA, zeroS: 0, continuous: true }, input, tauS);
  }
  // Discontinuous: each period starts from zero; the diode current reaches zero after τ·ln(1 + i1·R/(VF + E)).
  const on = exponentialSegment(0, onSlope, onS, tauS);
  const conductS = Math.min(offS, tauS * Math.log1p((on.endA * r) / (vf + e)));
  const off = exponentialSegment(on.endA, offSlope, conductS, tauS);
  return summarise({ on, off: { ...off, endA: 0 }, turnOnA: 0, turnOffA: on.endA, zeroS: offS - conductS, continuous: false }, input, tauS);
}

export interface SimulationOptions {
  /** Steps per period; by default enough for steps of at most τe/100, and at least 4000. */
  stepsPerPeriod?: number;
  maxPeriods?: number;
  /** Stop when the start-of-period current is estimated within this of its periodic value. */
  toleranceA?: number;
}

interface Interval {
  driveV: number;
  steps: number;
  stepS: number;
}

interface PeriodTotals {
  endA: number;
  turnOffA: number;
  minA: number;
  maxA: number;
  onChargeAs: number;
  onSquareA2s: number;
  offChargeAs: number;
  offSquareA2s: number;
  zeroS: number;
}

/** One classical RK4 step of L·di/dt = drive − i·R, clamped at 0 (the diode or switch blocks reverse current). */
function rk4Step(i: number, driveV: number, r: number, l: number, h: number): { next: number; raw: number } {
  const slope = (x: number): number => (driveV - x * r) / l;
  const k1 = slope(i);
  const k2 = slope(i + (h / 2) * k1);
  const k3 = slope(i + (h / 2) * k2);
  const k4 = slope(i + h * k3);
  const raw = i + (h / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
  return { next: Math.max(0, raw), raw };
}

/** Steps through one interval, adding trapezoid integrals; a step that hits zero is cut where it crosses. */
function runInterval(startA: number, interval: Interval, r: number, l: number, totals: PeriodTotals, isOn: boolean): number {
  let i = startA;
  const h = interval.stepS;
  for (let k = 0; k < interval.steps; k += 1) {
    const { next, raw } = rk4Step(i, interval.driveV, r, l, h);
    const conductingS = next === 0 ? (i > 0 ? (h * i) / (i - raw) : 0) : h;
    const charge = next === 0 ? (i * conductingS) / 2 : ((i + next) * h) / 2;
    const square = next === 0 ? (i * i * conductingS) / 3 : ((i * i + next * next) * h) / 2;
    if (isOn) {
      totals.onChargeAs += charge;
      totals.onSquareA2s += square;
    } else {
      totals.offChargeAs += charge;
      totals.offSquareA2s += square;
    }
    totals.zeroS += h - conductingS;
    i = next;
    totals.minA = Math.min(totals.minA, i);
    totals.maxA = Math.max(totals.maxA, i);
  }
  return i;
}

function runPeriod(startA: number, on: Interval, off: Interval, r: number, l: number): PeriodTotals {
  const totals: PeriodTotals = {
    endA: 0,
    turnOffA: 0,
    minA: startA,
    maxA: startA,
    onChargeAs: 0,
    onSquareA2s: 0,
    offChargeAs: 0,
    offSquareA2s: 0,
    zeroS: 0,
  };
  totals.turnOffA = runInterval(startA, on, r, l, totals, true);
  totals.endA = runInterval(totals.turnOffA, off, r, l, totals, false);
  return totals;
}

function simulationIntervals(input: RippleInput, stepsPerPeriod: number): { on: Interval; off: Interval } {
  const periodS = 1 / input.frequencyHz;
  const onSteps = input.duty > 0 ? Math.max(1, Math.round(input.duty * stepsPerPeriod)) : 0;
  const offSteps = input.duty < 1 ? Math.max(1, Math.round((1 - input.duty) * stepsPerPeriod)) : 0;
  return {
    on: { driveV: input.supplyV - input.backEmfV, steps: onSteps, stepS: onSteps > 0 ? (input.duty * periodS) / onSteps : 0 },
    off: {
      driveV: -input.diodeForwardV - input.backEmfV,
      steps: offSteps,
      stepS: offSteps > 0 ? ((1 - input.duty) * periodS) / offSteps : 0,
    },
  };
}

/**
 * Independent check of periodicCurrent: fixed-step RK4 from i = 0, period after period, until the
 * start-of-period current repeats. The remaining error is estimated from the observed contraction
 * q = Δk/Δk−1 of successive changes (geometric tail Δk·q/(1 − q)), not from the closed form.
 */
export function simulatePeriodicCurrent(input: RippleInput, opts: SimulationOptions = {}): RippleResult {
  validateRippleInput(input);
  const tauS = input.inductanceH / input.resistanceOhm;
  const periodsPerTau = input.frequencyHz * tauS;
  const steps = opts.stepsPerPeriod ?? Math.min(1_000_000, Math.max(4000, Math.ceil(100 / periodsPerTau)));
  const maxPeriods = opts.maxPeriods ?? 200_000;
  const toleranceA = opts.toleranceA ?? 1e-10;
  const { on, off } = simulationIntervals(input, steps);
  let startA = 0;
  let lastChangeA = Number.NaN;
  for (let period = 0; period < maxPeriods; period += 1) {
    const endA = runPeriod(startA, on, off, input.resistanceOhm, input.inductanceH).endA;
    const changeA = Math.abs(endA - startA);
    const q = changeA / lastChangeA;
    const tailA = changeA === 0 ? 0 : q < 1 ? (changeA * q) / (1 - q) : Number.POSITIVE_INFINITY;
    startA = endA;
    lastChangeA = changeA;
    if (changeA <= toleranceA && tailA <= toleranceA) {
      return simulatedResult(startA, runPeriod(startA, on, off, input.resistanceOhm, input.inductanceH), input, tauS);
    }
  }
  throw new Error(`simulatePeriodicCurrent: no periodic state within ${maxPeriods} periods`);
}

function simulatedResult(startA: number, t: PeriodTotals, input: RippleInput, tauS: number): RippleResult {
  const continuous = t.minA > 0;
  return summarise(
    {
      on: { endA: t.turnOffA, chargeAs: t.onChargeAs, squareA2s: t.onSquareA2s },
      off: { endA: t.endA, chargeAs: t.offChargeAs, squareA2s: t.offSquareA2s },
      turnOnA: startA,
      turnOffA: t.turnOffA,
      zeroS: t.zeroS,
      continuous,
    },
    input,
    tauS,
  );
}

/**
 * Back-EMF at which the mean motor current equals the target (a load torque fixes the mean current:
 * I = I0 + T/Kt). The mean current falls as E rises, so bisection on [0, V]. When even E = 0 gives less
 * than the target, the motor stalls at this duty: E = 0. A target of zero or less gives E = V (no current).
 */
export function solveBackEmfForMeanCurrentV(
  base: Omit<RippleInput, 'backEmfV'>,
  targetMeanA: number,
): { backEmfV: number; result: RippleResult } {
  if (!Number.isFinite(targetMeanA)) throw new RangeError('targetMeanA must be a finite number');
  const at = (backEmfV: number): RippleResult => periodicCurrent({ ...base, backEmfV });
  const stalled = at(0);
  if (stalled.meanA <= targetMeanA) return { backEmfV: 0, result: stalled };
  if (targetMeanA <= 0) return { backEmfV: base.supplyV, result: at(base.supplyV) };
  let low = 0;
  let high = base.supplyV;
  for (let k = 0; k < 200 && high - low > 1e-13 * base.supplyV; k += 1) {
    const mid = (low + high) / 2;
    if (at(mid).meanA > targetMeanA) low = mid;
    else high = mid;
  }
  const backEmfV = (low + high) / 2;
  return { backEmfV, result: at(backEmfV) };
}

export interface RippleOperatingPointArgs {
  model: Pick<MotorModel, 'resistanceOhm' | 'keVsPerRad' | 'ktNmPerA' | 'noLoadCurrentA'>;
  supplyV: number;
  duty: number;
  diodeForwardV: number;
  load: MotorLoad;
  seriesResistanceOhm: number;
  inductanceH: number;
  frequencyHz: number;
}

export interface RippleOperatingPoint {
  backEmfV: number;
  speedRpm: number;
  ripple: RippleResult;
}

/** The motor under PWM with its inductance: torque load → mean current I0 + T/Kt; speed load → E = Ke·ω; stall → E = 0. */
export function rippleOperatingPoint(args: RippleOperatingPointArgs): RippleOperatingPoint {
  const { model, load } = args;
  const base: Omit<RippleInput, 'backEmfV'> = {
    supplyV: args.supplyV,
    resistanceOhm: model.resistanceOhm + args.seriesResistanceOhm,
    inductanceH: args.inductanceH,
    diodeForwardV: args.diodeForwardV,
    duty: args.duty,
    frequencyHz: args.frequencyHz,
  };
  let backEmfV = 0;
  let ripple: RippleResult;
  if (load.kind === 'torque') {
    ({ backEmfV, result: ripple } = solveBackEmfForMeanCurrentV(base, model.noLoadCurrentA + load.torqueNm / model.ktNmPerA));
  } else {
    if (load.kind === 'speed' && !(load.speedRpm >= 0)) throw new RangeError('load.speedRpm must be ≥ 0 (a motoring drive)');
    backEmfV = load.kind === 'speed' ? model.keVsPerRad * rpmToRadPerS(load.speedRpm) : 0;
    ripple = periodicCurrent({ ...base, backEmfV });
  }
  return { backEmfV, speedRpm: radPerSToRpm(backEmfV / model.keVsPerRad), ripple };
}

/**
 * Below this f·τe the ripple and discontinuous conduction deserve a caution [judgement]: at f·τe = 5 and
 * D = 0.5 the peak-to-peak ripple is about V/(4·L·f) = 5 % of the stall current V/R, so the current stays
 * continuous down to a light load of about 2.5 % of stall (below typical no-load currents) and the RMS
 * excess ΔI²/12 is negligible; the ripple grows as 1/(f·τe) below it, and by f·τe ≈ 1 it is ~25 % of stall.
 */
export const MIN_PERIODS_PER_TAU = 5;

/** A caution when f·τe is low; null when it is not, or when τe is unknown (not a positive number). */
export function pwmFrequencyCaution(frequencyHz: number, tauS: number): string | null {
  if (!(tauS > 0) || !(frequencyHz > 0) || !Number.isFinite(tauS * frequencyHz)) return null;
  const periodsPerTau = frequencyHz * tauS;
  if (periodsPerTau >= MIN_PERIODS_PER_TAU) return null;
  const neededKHz = MIN_PERIODS_PER_TAU / tauS / 1000;
  return (
    `PWM at ${formatNumber(frequencyHz / 1000)} kHz is only ${formatNumber(periodsPerTau)} electrical time constants ` +
    `(τe = ${formatNumber(tauS * 1000)} ms) per period: the current ripple is large and the current may fall to zero ` +
    'each cycle (discontinuous conduction), so the switch RMS, peak and turn-off currents exceed the mean-voltage ' +
    `figures and the motor runs faster than they say. Raise the PWM frequency to at least ${formatNumber(neededKHz)} kHz ` +
    '(above about 18–25 kHz it also leaves the audible band, at the cost of more switching loss), or accept the higher ' +
    'RMS current and check the switch and diode against the ripple figures.'
  );
}

/** Three significant digits, without exponent notation for the ranges shown here. */
function formatNumber(value: number): string {
  return sig(value, 3);
}
