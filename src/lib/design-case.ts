/**
 * A design case (motor, supply, logic output, drive, environment) and its worst-case operating values.
 * Worst cases: highest supply and coldest winding for stall current, highest supply for voltages,
 * hottest ambient for thermal, lowest logic high for gate drive.
 */
import type { SharedLogicSupply, StallProtection } from './domain/design.ts';
import type { MotorParams } from './domain/parts.ts';
import type { SupplyRange } from './driver-checks.ts';
import type { ESeriesName } from './eseries.ts';
import {
  checkConsistency,
  motorModelFromDatasheet,
  stallCurrentAtWindingA,
  windingResistanceOhm,
  type MotorConsistency,
  type MotorModel,
} from './motor.ts';
import { rippleOperatingPoint } from './ripple.ts';
import type { ResetDefault } from './power-on.ts';
import { pwmOperatingPoint, type MotorLoad } from './pwm.ts';
import { DEFAULT_MARGINS, type SwitchMargins } from './switch-evaluation.ts';

export type DriveMode = { mode: 'onoff' } | { mode: 'pwm'; frequencyHz: number; dutyMin: number; dutyMax: number };

export interface LogicRail {
  /** VOH min of the controller pin. */
  highV: number;
  /** VOL max of the controller pin. */
  lowV: number;
  railV: number;
  pinSourceCurrentA: number;
  pinSinkCurrentA: number;
  resetDefault: ResetDefault;
}

export interface DesignCase {
  motor: MotorParams;
  supplyMinV: number;
  supplyNomV: number;
  supplyMaxV: number;
  /** Wiring, shunt, connector and the source's internal resistance: everything in series with the motor besides the switch. */
  seriesResistanceOhm: number;
  logic: LogicRail;
  drive: DriveMode;
  ambientMinC: number;
  ambientMaxC: number;
  load: MotorLoad;
  margins?: Partial<SwitchMargins>;
  gateResistanceOhm?: number;
  /** Rail feeding a gate driver when one is needed; defaults to the motor supply range. */
  driverSupply?: SupplyRange;
  /** Freewheel diode drop assumed before a diode is chosen; default 0.7 V (silicon, conservative). */
  diodeForwardV?: number;
  /** Series for pull resistors; default E12. */
  resistorSeries?: ESeriesName;
  /** The source's limits (seriesResistanceOhm already includes its internal resistance). */
  source?: { internalResistanceOhm: number; continuousCurrentA: number | null; currentLimitA: number | null };
  /** The controller fed from the motor's source; null or absent when it has its own supply. */
  logicSupply?: SharedLogicSupply | null;
  /** What limits a jammed motor; absent = none (steady state at stall). */
  stallProtection?: StallProtection;
}

export const DEFAULT_DIODE_FORWARD_V = 0.7;

/** What the workspace shows of the ripple at the worst-heat point. */
export interface RippleSummary {
  rippleA: number;
  peakA: number;
  continuous: boolean;
  zeroFraction: number;
  periodsPerTau: number;
  backEmfV: number;
  duty: number;
  supplyV: number;
}

export interface WorstCase {
  supplyMinV: number;
  supplyMaxV: number;
  /** Stall current at the highest supply with the winding at the coldest ambient. */
  stallCurrentMaxA: number;
  /** Motor current while the switch conducts, at the duty that heats the switch most. */
  runningCurrentA: number;
  /** Duty paired with runningCurrentA (1 for on/off). */
  switchDuty: number;
  /** Worst (1 − D)·I over the duty range (0 for on/off). */
  diodeMeanCurrentA: number;
  /** RMS switch current at the worst-heat point (ripple included when the inductance is known). */
  switchRmsA: number;
  /** Currents switched at turn-on and turn-off at that point (equal to the mean without ripple). */
  turnOnCurrentA: number;
  turnOffCurrentA: number;
  /** Ripple at the worst-heat point; null without PWM or without the motor's inductance. */
  ripple: RippleSummary | null;
  /** Current the diode takes over at every turn-off under PWM (worst over duty, jam included); null for on/off. */
  diodeRepetitivePeakA: number | null;
  /** The jam the switch and diode must survive. */
  stall: {
    protection: StallProtection;
    /** Duty the switch is judged at while jammed (the highest commanded; 1 for on/off). */
    duty: number;
    /** Motor current while jammed (limited when a current limit is set). */
    currentA: number;
    currentRmsA: number;
    peakA: number;
    /** Worst (1 − D)·Is,pwm over the duty range. */
    diodeMeanA: number;
  };
  gateDriveMinV: number;
  gateDriveMaxV: number;
  ambientMaxC: number;
  windingColdC: number;
  pwmHz: number | null;
  diodeForwardV: number;
}

export function marginsOf(c: DesignCase): SwitchMargins {
  return { ...DEFAULT_MARGINS, ...c.margins };
}

export function motorModelOf(c: DesignCase): MotorModel {
  return motorModelFromDatasheet({ ...c.motor, terminalResistanceOhm: c.motor.terminalResistanceOhm });
}

export function motorConsistencyOf(c: DesignCase): MotorConsistency {
  return checkConsistency(c.motor, motorModelOf(c));
}

function dutyGrid(drive: DriveMode): number[] {
  if (drive.mode === 'onoff') return [1];
  const steps = 10;
  return Array.from({ length: steps + 1 }, (_, i) => drive.dutyMin + ((drive.dutyMax - drive.dutyMin) * i) / steps);
}

/** The periodic current at one supply and duty: the ripple module when L is known under PWM, else the mean-voltage model. */
interface PointCurrents {
  meanA: number;
  switchRmsA: number;
  turnOnA: number;
  turnOffA: number;
  diodeMeanA: number;
  ripple: RippleSummary | null;
}

function pointCurrents(
  model: MotorModel,
  c: DesignCase,
  supplyV: number,
  duty: number,
  diodeForwardV: number,
  load: MotorLoad,
): PointCurrents {
  const inductanceH = c.motor.inductanceH;
  if (c.drive.mode === 'pwm' && inductanceH != null && inductanceH > 0 && duty < 1) {
    const p = rippleOperatingPoint({
      model,
      supplyV,
      duty,
      diodeForwardV,
      load,
      seriesResistanceOhm: c.seriesResistanceOhm,
      inductanceH,
      frequencyHz: c.drive.frequencyHz,
    });
    const r = p.ripple;
    return {
      meanA: r.meanA,
      switchRmsA: r.switchRmsA,
      turnOnA: r.turnOnA,
      turnOffA: r.turnOffA,
      diodeMeanA: r.diodeMeanA,
      ripple: {
        rippleA: r.rippleA,
        peakA: r.peakA,
        continuous: r.continuous,
        zeroFraction: r.zeroFraction,
        periodsPerTau: r.periodsPerTau,
        backEmfV: p.backEmfV,
        duty,
        supplyV,
      },
    };
  }
  const currentA = pwmOperatingPoint(model, supplyV, duty, diodeForwardV, load, c.seriesResistanceOhm).currentA;
  return {
    meanA: currentA,
    switchRmsA: currentA * Math.sqrt(duty),
    turnOnA: currentA,
    turnOffA: currentA,
    diodeMeanA: c.drive.mode === 'pwm' ? (1 - duty) * currentA : 0,
    ripple: null,
  };
}

/** The model with its winding at the coldest ambient (a cold winding draws the most stall current) [IEC 60028]. */
function coldModel(model: MotorModel, windingC: number): MotorModel {
  return { ...model, resistanceOhm: windingResistanceOhm(model.resistanceOhm, windingC) };
}

/**
 * A jammed shaft [docs/engineering.md §6]: the switch at the highest commanded duty, the diode at the worst (1 − D)
 * share over the duty range, at the highest supply with the coldest winding; a current limit caps the current.
 */
function stallCaseOf(c: DesignCase, model: MotorModel, diodeForwardV: number, fullOnA: number): WorstCase['stall'] {
  // A copy: the worst case is kept and frozen (worstCaseOf), and must not freeze the caller's input.
  const protection: StallProtection = { ...(c.stallProtection ?? { kind: 'none' }) };
  const cold = coldModel(model, c.ambientMinC);
  const cap = (a: number): number => (protection.kind === 'current-limit' ? Math.min(a, protection.limitA) : a);
  const stalled: MotorLoad = { kind: 'stall-only' };
  if (c.drive.mode !== 'pwm') {
    const currentA = cap(fullOnA);
    return { protection, duty: 1, currentA, currentRmsA: currentA, peakA: currentA, diodeMeanA: 0 };
  }
  const dutyMax = c.drive.dutyMax;
  const atMax = dutyMax >= 1 ? null : pointCurrents(cold, c, c.supplyMaxV, dutyMax, diodeForwardV, stalled);
  const currentA = cap(atMax ? atMax.meanA : fullOnA);
  const limited = protection.kind === 'current-limit' && atMax != null && atMax.meanA > protection.limitA;
  const currentRmsA = atMax && !limited ? atMax.switchRmsA : currentA * Math.sqrt(dutyMax);
  const peakA = cap(atMax ? atMax.turnOffA : fullOnA);
  let diodeMeanA = 0;
  for (const duty of dutyGrid(c.drive)) {
    if (duty >= 1) continue;
    const p = pointCurrents(cold, c, c.supplyMaxV, duty, diodeForwardV, stalled);
    diodeMeanA = Math.max(
      diodeMeanA,
      protection.kind === 'current-limit' ? (1 - duty) * Math.min(p.meanA, protection.limitA) : p.diodeMeanA,
    );
  }
  return { protection, duty: dutyMax, currentA, currentRmsA, peakA, diodeMeanA };
}

/** The worst cases last worked out, by their case's content (a match asks for the same one several times). */
const recentWorstCases = new Map<string, WorstCase>();
const RECENT_WORST_CASES = 64;

/** JSON of a case that tells non-finite numbers apart (JSON alone writes Infinity and NaN as null). */
const caseKey = (c: DesignCase): string =>
  JSON.stringify(c, (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? `${String(v)}#number` : v));

function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object' && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const v of Object.values(value)) deepFreeze(v);
  }
  return value;
}

/**
 * Running currents use the 20 °C winding: conservative whenever the hot ambient is above 20 °C. The answer
 * depends on the case's content only; the last few are kept (frozen: shared by every caller), since
 * solving the ripple at each supply and duty costs about 10 ms and a match needs it two or three times.
 */
export function worstCaseOf(c: DesignCase): WorstCase {
  const key = caseKey(c);
  const known = recentWorstCases.get(key);
  if (known) {
    recentWorstCases.delete(key);
    recentWorstCases.set(key, known);
    return known;
  }
  const wc = deepFreeze(solveWorstCase(c));
  recentWorstCases.set(key, wc);
  if (recentWorstCases.size > RECENT_WORST_CASES) recentWorstCases.delete(recentWorstCases.keys().next().value as string);
  return wc;
}

function solveWorstCase(c: DesignCase): WorstCase {
  const model = motorModelOf(c);
  const diodeForwardV = c.diodeForwardV ?? DEFAULT_DIODE_FORWARD_V;
  let worst: { heat: number; duty: number; p: PointCurrents } | null = null;
  let diodeMeanCurrentA = 0;
  let diodeRepetitivePeakA = 0;
  for (const supplyV of [c.supplyMinV, c.supplyMaxV]) {
    for (const duty of dutyGrid(c.drive)) {
      const p = pointCurrents(model, c, supplyV, duty, diodeForwardV, c.load);
      if (worst == null || p.switchRmsA ** 2 > worst.heat) worst = { heat: p.switchRmsA ** 2, duty, p };
      diodeMeanCurrentA = Math.max(diodeMeanCurrentA, p.diodeMeanA);
      if (duty < 1) diodeRepetitivePeakA = Math.max(diodeRepetitivePeakA, p.turnOffA);
    }
  }
  const w = worst as { heat: number; duty: number; p: PointCurrents };
  const stallCurrentMaxA = stallCurrentAtWindingA(model, c.supplyMaxV, c.ambientMinC, c.seriesResistanceOhm);
  const stall = stallCaseOf(c, model, diodeForwardV, stallCurrentMaxA);
  const pwm = c.drive.mode === 'pwm';
  return {
    supplyMinV: c.supplyMinV,
    supplyMaxV: c.supplyMaxV,
    stallCurrentMaxA,
    runningCurrentA: w.p.meanA,
    switchDuty: w.duty,
    switchRmsA: w.p.switchRmsA,
    turnOnCurrentA: w.p.turnOnA,
    turnOffCurrentA: w.p.turnOffA,
    ripple: w.p.ripple,
    diodeMeanCurrentA,
    diodeRepetitivePeakA: pwm ? Math.max(diodeRepetitivePeakA, stall.peakA) : null,
    stall,
    gateDriveMinV: c.logic.highV,
    gateDriveMaxV: c.logic.railV,
    ambientMaxC: c.ambientMaxC,
    windingColdC: c.ambientMinC,
    pwmHz: c.drive.mode === 'pwm' ? c.drive.frequencyHz : null,
    diodeForwardV,
  };
}
