/**
 * Level-shift / gate-driver checks between a logic output and a MOSFET gate [docs/engineering.md §7].
 */
import { fmt, makeCheck, marginAbove, marginBelow, type Check } from './checks.ts';
import type { DriverParams } from './domain/parts.ts';
import { checkSwitchingEdges } from './mosfet-checks.ts';

/** The controller's output levels: VOH min, VOL max and the rail the pin runs from. */
export interface LogicLevels {
  highV: number;
  lowV: number;
  railV: number;
}

export interface SupplyRange {
  minV: number;
  maxV: number;
}

/** 3.3 V LVTTL/LVCMOS input levels [JEDEC JESD8C]. */
export const LVTTL_INPUT = { highMinV: 2.0, lowMaxV: 0.8 } as const;

/** Input thresholds in volts for a given driver supply and logic rail (fixed, CMOS-ratio or input-rail). */
export function driverInputThresholdsV(
  driver: DriverParams,
  driverSupplyV: number,
  logicRailV: number,
): { highMinV: number; lowMaxV: number } {
  const reference = driver.inputLogic === 'fixed' ? 1 : driver.inputLogic === 'ratio' ? driverSupplyV : logicRailV;
  return { highMinV: driver.inputHighMin * reference, lowMaxV: driver.inputLowMax * reference };
}

/** Output high = driver supply less the drop at rated source current. */
export function driverOutputHighV(driver: DriverParams, driverSupplyV: number): number {
  return driverSupplyV - driver.outputHighDropV;
}

function checkDriverSupply(driver: DriverParams, supply: SupplyRange): Check {
  const ok = supply.minV >= driver.supplyMinV && supply.maxV <= driver.supplyMaxV;
  const lowSide = supply.minV < driver.supplyMinV;
  const note = ok
    ? `Supply ${fmt(supply.minV)}–${fmt(supply.maxV)} V is inside the driver's ${fmt(driver.supplyMinV)}–${fmt(driver.supplyMaxV)} V range.`
    : `Supply ${fmt(supply.minV)}–${fmt(supply.maxV)} V leaves the driver's ${fmt(driver.supplyMinV)}–${fmt(driver.supplyMaxV)} ` +
      `V range: feed it from a rail inside that range or choose another driver.`;
  const value = lowSide ? supply.minV : supply.maxV;
  const limit = lowSide ? driver.supplyMinV : driver.supplyMaxV;
  return makeCheck({
    id: 'driver-supply',
    ok,
    value,
    limit,
    unit: 'V',
    margin: lowSide ? marginAbove(value, limit) : marginBelow(value, limit),
    note,
  });
}

/** Noise margin each way, as a share of the logic rail: VOH,min − VIH,max and VIL,max − VOL,max [practice]. */
export const NOISE_MARGIN_SHARE_OF_RAIL = 0.1;

/**
 * Input high worst case: the highest VIH over the supply range; input low: the lowest VIL. Each is judged with a
 * noise margin of 10 % of the logic rail (limit = VIH + margin, VIL − margin); inside the threshold but short of the
 * margin is marginal, beyond the threshold a hard fail [docs/engineering.md §7].
 */
function checkInputLevels(driver: DriverParams, supply: SupplyRange, logic: LogicLevels): Check[] {
  const vihV = driverInputThresholdsV(driver, supply.maxV, logic.railV).highMinV;
  const vilV = driverInputThresholdsV(driver, supply.minV, logic.railV).lowMaxV;
  const marginV = NOISE_MARGIN_SHARE_OF_RAIL * logic.railV;
  const highLimitV = vihV + marginV;
  const lowLimitV = vilV - marginV;
  const highHard = logic.highV >= vihV;
  const lowHard = logic.lowV <= vilV;
  const highOk = logic.highV >= highLimitV;
  const lowOk = logic.lowV <= lowLimitV;
  const ratioHint =
    driver.inputLogic === 'ratio' ? ' (its thresholds scale with its own supply; a logic-level or translating input is needed)' : '';
  const mv = `${fmt(marginV * 1000)} mV`;
  return [
    makeCheck(
      {
        id: 'input-high',
        ok: highOk,
        value: logic.highV,
        limit: highLimitV,
        unit: 'V',
        margin: marginAbove(logic.highV, highLimitV),
        note: highOk
          ? `Logic high ${fmt(logic.highV)} V clears the driver's VIH of ${fmt(vihV)} V by ${fmt((logic.highV - vihV) * 1000)} mV (at least ${mv}, 10 % of the rail).`
          : highHard
            ? `Logic high ${fmt(logic.highV)} V clears VIH ${fmt(vihV)} V by only ${fmt((logic.highV - vihV) * 1000)} mV, less than the ${mv} noise margin: choose a driver with a lower VIH.`
            : `Logic high ${fmt(logic.highV)} V is below the driver's VIH of ${fmt(vihV)} V${ratioHint}: choose a driver with TTL-level or input-rail thresholds.`,
      },
      highHard ? 'margin' : 'hard',
    ),
    makeCheck(
      {
        id: 'input-low',
        ok: lowOk,
        value: logic.lowV,
        limit: lowLimitV,
        unit: 'V',
        margin: marginBelow(logic.lowV, lowLimitV),
        note: lowOk
          ? `Logic low ${fmt(logic.lowV)} V is under the driver's VIL of ${fmt(vilV)} V by ${fmt((vilV - logic.lowV) * 1000)} mV (at least ${mv}).`
          : lowHard
            ? `Logic low ${fmt(logic.lowV)} V is under VIL ${fmt(vilV)} V by only ${fmt((vilV - logic.lowV) * 1000)} mV, less than the ${mv} noise margin: choose a driver with a higher VIL.`
            : `Logic low ${fmt(logic.lowV)} V is above the driver's VIL of ${fmt(vilV)} V: the driver may not switch off; choose one with a higher VIL.`,
      },
      lowHard ? 'margin' : 'hard',
    ),
  ];
}

function checkOutputHigh(driver: DriverParams, supply: SupplyRange, requiredGateV: number | null): Check {
  const outV = driverOutputHighV(driver, supply.minV);
  if (requiredGateV == null) {
    return makeCheck({
      id: 'output-high',
      ok: false,
      value: outV,
      limit: null,
      unit: 'V',
      margin: null,
      note: 'The switch has no RDS(on) line on record, so the gate voltage it needs is unknown.',
    });
  }
  const ok = outV >= requiredGateV;
  const note = ok
    ? `Output high ${fmt(outV)} V at the lowest supply reaches the ${fmt(requiredGateV)} V the switch's RDS(on) is specified at.`
    : `Output high ${fmt(outV)} V at the lowest supply falls short of the ${fmt(requiredGateV)} V the switch needs: run the driver from a higher rail or choose a switch specified at lower VGS.`;
  return makeCheck({ id: 'output-high', ok, value: outV, limit: requiredGateV, unit: 'V', margin: marginAbove(outV, requiredGateV), note });
}

function checkOutputVsGateRating(supply: SupplyRange, vgsMaxV: number): Check {
  const ok = supply.maxV <= vgsMaxV;
  const note = ok
    ? `Unloaded output (≈ supply, up to ${fmt(supply.maxV)} V) stays within the switch's VGS(max) ${fmt(vgsMaxV)} V.`
    : `Output can reach ${fmt(supply.maxV)} V, above the switch's VGS(max) ${fmt(vgsMaxV)} V: use a lower driver rail or a gate clamp.`;
  return makeCheck({
    id: 'gate-voltage-rating',
    ok,
    value: supply.maxV,
    limit: vgsMaxV,
    unit: 'V',
    margin: marginBelow(supply.maxV, vgsMaxV),
    note,
  });
}

/** Duty error ≈ Δt·f; above 1 % the commanded duty drifts noticeably [practice, judgement]. */
export const DUTY_ERROR_LIMIT = 0.01;

function checkDutyError(driver: DriverParams, pwmHz: number | null): Check {
  if (pwmHz == null) {
    return makeCheck({
      id: 'duty-error',
      ok: true,
      value: null,
      limit: null,
      unit: '',
      margin: null,
      note: 'Plain on/off drive: propagation delay does not matter.',
    });
  }
  const errorFraction = driver.propagationDelayNs * 1e-9 * pwmHz;
  const ok = errorFraction <= DUTY_ERROR_LIMIT;
  const note = ok
    ? `Propagation delay ${fmt(driver.propagationDelayNs)} ns shifts duty by about ${fmt(errorFraction * 100)} %.`
    : `Propagation delay ${fmt(driver.propagationDelayNs)} ns shifts duty by about ${fmt(errorFraction * 100)} % and limits the shortest pulse: choose a faster driver or lower the PWM frequency.`;
  return makeCheck(
    {
      id: 'duty-error',
      ok,
      value: errorFraction,
      limit: DUTY_ERROR_LIMIT,
      unit: '',
      margin: marginBelow(errorFraction, DUTY_ERROR_LIMIT),
      note,
    },
    'margin',
  );
}

function polarityCheck(driver: DriverParams): Check {
  const note = driver.inverting
    ? 'Inverting: a logic low turns the motor on. Invert in firmware, and make sure the pin is held high through reset.'
    : 'Non-inverting: a logic high turns the motor on.';
  return makeCheck({ id: 'polarity', ok: true, value: null, limit: null, unit: '', margin: null, note });
}

export interface DriverCheckInput {
  driver: DriverParams;
  supply: SupplyRange;
  logic: LogicLevels;
  /** Lowest VGS at which the switch's RDS(on) is specified. */
  requiredGateV: number | null;
  vgsMaxV: number;
  switchingChargeNc: number;
  pwmHz: number | null;
}

/** All driver checks; edges t_on ≈ Q_sw/I_source, t_off ≈ Q_sw/I_sink [docs/engineering.md §7]. */
export function checkDriver(input: DriverCheckInput): Check[] {
  const { driver } = input;
  const chargeC = input.switchingChargeNc * 1e-9;
  return [
    checkDriverSupply(driver, input.supply),
    ...checkInputLevels(driver, input.supply, input.logic),
    checkOutputHigh(driver, input.supply, input.requiredGateV),
    checkOutputVsGateRating(input.supply, input.vgsMaxV),
    checkSwitchingEdges(chargeC / driver.sourceCurrentA, chargeC / driver.sinkCurrentA, input.pwmHz),
    checkDutyError(driver, input.pwmHz),
    polarityCheck(driver),
  ];
}
