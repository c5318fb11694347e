/** Turns a saved design (what the designer entered) into the engineering core's DesignCase. */
import type { DesignCase } from './design-case.ts';
import type { DesignInput } from './domain/design.ts';
import type { MotorParams } from './domain/parts.ts';

/** A separate driver rail is judged at ±5 % of its nominal value [practice: a regulated rail's usual band]. */
export const DRIVER_RAIL_TOLERANCE = 0.05;

/** The rail feeding a gate driver: the separate rail's ±5 % band, or the motor supply's range (null = the motor supply). */
export function driverSupplyRangeOf(input: Pick<DesignInput, 'driverSupplyV' | 'supply'>): { minV: number; maxV: number } {
  const v = input.driverSupplyV;
  return v == null
    ? { minV: input.supply.minV, maxV: input.supply.maxV }
    : { minV: v * (1 - DRIVER_RAIL_TOLERANCE), maxV: v * (1 + DRIVER_RAIL_TOLERANCE) };
}

export function designCaseOf(input: DesignInput, motor: MotorParams): DesignCase {
  return {
    motor,
    supplyMinV: input.supply.minV,
    supplyNomV: input.supply.nomV,
    supplyMaxV: input.supply.maxV,
    // The source's internal resistance joins the loop wherever the motor is re-scaled.
    seriesResistanceOhm: input.wiringResistanceOhm + input.shuntResistanceOhm + input.supply.internalResistanceOhm,
    logic: {
      highV: input.logic.highV,
      lowV: input.logic.lowV,
      railV: input.logic.railV,
      pinSourceCurrentA: input.logic.pinSourceCurrentA,
      pinSinkCurrentA: input.logic.pinSinkCurrentA,
      resetDefault: {
        pull: input.logic.resetPull,
        pullOhms: input.logic.resetPullOhms,
        pullTolerance: input.logic.resetPullTolerance,
      },
    },
    drive: input.drive,
    ambientMinC: input.ambientMinC,
    ambientMaxC: input.ambientMaxC,
    load: input.load,
    margins: input.margins,
    driverSupply: input.driverSupplyV == null ? undefined : driverSupplyRangeOf(input),
    source: {
      internalResistanceOhm: input.supply.internalResistanceOhm,
      continuousCurrentA: input.supply.continuousCurrentA,
      currentLimitA: input.supply.currentLimitA,
    },
    logicSupply: input.logic.sharedSupply,
    stallProtection: input.stallProtection,
  };
}
