/** Turns a saved design (what the designer entered) into the engineering core's DesignCase. */
import type { DesignCase } from './design-case.ts';
import type { DesignInput } from './domain/design.ts';
import type { MotorParams } from './domain/parts.ts';

export function designCaseOf(input: DesignInput, motor: MotorParams): DesignCase {
  const driverSupplyV = input.driverSupplyV;
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
    driverSupply: driverSupplyV == null ? undefined : { minV: driverSupplyV * 0.95, maxV: driverSupplyV * 1.05 },
    source: {
      internalResistanceOhm: input.supply.internalResistanceOhm,
      continuousCurrentA: input.supply.continuousCurrentA,
      currentLimitA: input.supply.currentLimitA,
    },
    logicSupply: input.logic.sharedSupply,
    stallProtection: input.stallProtection,
  };
}
