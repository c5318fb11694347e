/**
 * Junction temperature of a conducting MOSFET with a temperature-dependent RDS(on) [domain.md §4].
 */
import { DEFAULT_RDSON_TEMPCO_PER_C } from './rdson.ts';

export interface ConductionThermalInput {
  ambientC: number;
  rthJaCPerW: number;
  currentRmsA: number;
  rdsOn25Ohm: number;
  alphaPerC?: number;
  /** Losses that do not depend on Tj (switching), added to the junction's heat. */
  otherLossW?: number;
}

export interface ConductionThermalResult {
  /** Null when the loop runs away (no steady state). */
  junctionC: number | null;
  conductionLossW: number | null;
  rdsOnAtJunctionOhm: number | null;
  runaway: boolean;
}

/**
 * Closed form with k = RθJA·I²·RDS25: Tj = (TA + RθJA·P_other + k·(1 − 25α))/(1 − k·α);
 * runaway when k·α ≥ 1 [domain.md §4, extended with a Tj-independent loss].
 */
export function solveConductionJunction(input: ConductionThermalInput): ConductionThermalResult {
  const alpha = input.alphaPerC ?? DEFAULT_RDSON_TEMPCO_PER_C;
  const otherW = input.otherLossW ?? 0;
  const k = input.rthJaCPerW * input.currentRmsA ** 2 * input.rdsOn25Ohm;
  if (k * alpha >= 1) return { junctionC: null, conductionLossW: null, rdsOnAtJunctionOhm: null, runaway: true };
  const junctionC = (input.ambientC + input.rthJaCPerW * otherW + k * (1 - 25 * alpha)) / (1 - k * alpha);
  const rdsOnAtJunctionOhm = input.rdsOn25Ohm * (1 + alpha * (junctionC - 25));
  return {
    junctionC,
    conductionLossW: input.currentRmsA ** 2 * rdsOnAtJunctionOhm,
    rdsOnAtJunctionOhm,
    runaway: false,
  };
}

/** Tj = TA + P·RθJA. */
export function junctionFromLossC(ambientC: number, lossW: number, rthJaCPerW: number): number {
  return ambientC + lossW * rthJaCPerW;
}

/** ID(TA) = √((Tj,max − TA)/(RθJA·RDS(on)(Tj,max))): the current that brings the junction to Tj,max. */
export function maxCurrentAtAmbientA(tjMaxC: number, ambientC: number, rthJaCPerW: number, rdsOnAtTjMaxOhm: number): number {
  const riseC = tjMaxC - ambientC;
  return riseC > 0 ? Math.sqrt(riseC / (rthJaCPerW * rdsOnAtTjMaxOhm)) : 0;
}
