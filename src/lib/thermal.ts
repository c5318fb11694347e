/**
 * Junction temperature of a conducting MOSFET with a temperature-dependent RDS(on) [docs/engineering.md §5].
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
 * runaway when k·α ≥ 1 [docs/engineering.md §5, extended with a Tj-independent loss].
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

/** One single-pulse Zth point: impedance after a pulse of pulseS seconds. */
export interface ZthCurvePoint {
  pulseS: number;
  zthCPerW: number;
}

/**
 * Single-pulse Zth(t) from datasheet points: log–log interpolation between neighbours; below the first pulse
 * the first point's value (conservative, Zth rises with t); beyond the last, RθJA; never above RθJA
 * [docs/engineering.md §6, calc].
 */
export function zthAtPulseCPerW(points: readonly ZthCurvePoint[], pulseS: number, rthJaCPerW: number): number {
  const sorted = points.filter((p) => p.pulseS > 0 && p.zthCPerW > 0).sort((a, b) => a.pulseS - b.pulseS);
  if (sorted.length === 0) return rthJaCPerW;
  if (pulseS <= sorted[0].pulseS) return Math.min(rthJaCPerW, sorted[0].zthCPerW);
  const upperIndex = sorted.findIndex((p) => p.pulseS >= pulseS);
  if (upperIndex === -1) return rthJaCPerW;
  const lo = sorted[upperIndex - 1];
  const hi = sorted[upperIndex];
  const f = (Math.log(pulseS) - Math.log(lo.pulseS)) / (Math.log(hi.pulseS) - Math.log(lo.pulseS));
  return Math.min(rthJaCPerW, Math.exp(Math.log(lo.zthCPerW) + f * (Math.log(hi.zthCPerW) - Math.log(lo.zthCPerW))));
}
