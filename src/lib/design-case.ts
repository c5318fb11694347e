/**
 * A design case (motor, supply, logic output, drive, environment) and its worst-case operating values.
 * Worst cases: highest supply and coldest winding for stall current, highest supply for voltages,
 * hottest ambient for thermal, lowest logic high for gate drive.
 */
import type { SharedLogicSupply, StallProtection } from './domain/design.ts';
import type { MotorParams } from './domain/parts.ts';
import type { SupplyRange } from './driver-checks.ts';
import type { ESeriesName } from './eseries.ts';
import { checkConsistency, motorModelFromDatasheet, stallCurrentAtWindingA, type MotorConsistency, type MotorModel } from './motor.ts';
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

/** Running currents use the 20 °C winding: conservative whenever the hot ambient is above 20 °C. */
export function worstCaseOf(c: DesignCase): WorstCase {
  const model = motorModelOf(c);
  const diodeForwardV = c.diodeForwardV ?? DEFAULT_DIODE_FORWARD_V;
  let switchHeat = -1;
  let runningCurrentA = 0;
  let switchDuty = 1;
  let diodeMeanCurrentA = 0;
  for (const supplyV of [c.supplyMinV, c.supplyMaxV]) {
    for (const duty of dutyGrid(c.drive)) {
      const currentA = pwmOperatingPoint(model, supplyV, duty, diodeForwardV, c.load, c.seriesResistanceOhm).currentA;
      if (currentA ** 2 * duty > switchHeat) {
        switchHeat = currentA ** 2 * duty;
        runningCurrentA = currentA;
        switchDuty = duty;
      }
      if (c.drive.mode === 'pwm') diodeMeanCurrentA = Math.max(diodeMeanCurrentA, (1 - duty) * currentA);
    }
  }
  return {
    supplyMinV: c.supplyMinV,
    supplyMaxV: c.supplyMaxV,
    stallCurrentMaxA: stallCurrentAtWindingA(model, c.supplyMaxV, c.ambientMinC, c.seriesResistanceOhm),
    runningCurrentA,
    switchDuty,
    diodeMeanCurrentA,
    gateDriveMinV: c.logic.highV,
    gateDriveMaxV: c.logic.railV,
    ambientMaxC: c.ambientMaxC,
    windingColdC: c.ambientMinC,
    pwmHz: c.drive.mode === 'pwm' ? c.drive.frequencyHz : null,
    diodeForwardV,
  };
}
