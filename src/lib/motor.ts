/**
 * Linear steady-state model of a small brushed-DC motor (SI units throughout).
 * V = I·R + Ke·ω ; T_out = Kt·(I − I0) ; Kt = Ke in SI [docs/engineering.md §2].
 */
import { radPerSToRpm } from './units.ts';

/** The datasheet points the model is built from. */
export interface MotorDatasheetPoints {
  ratedVoltageV: number;
  noLoadSpeedRpm: number;
  noLoadCurrentA: number;
  stallCurrentA: number;
  stallTorqueNm: number;
  /** A measured terminal resistance replaces V/Is when given. */
  terminalResistanceOhm?: number | null;
}

export interface MotorModel {
  ratedVoltageV: number;
  resistanceOhm: number;
  keVsPerRad: number;
  ktNmPerA: number;
  noLoadCurrentA: number;
  frictionTorqueNm: number;
}

export interface MotorConsistency {
  torqueRatio: number;
  warning: string | null;
}

/** Datasheets often disagree with themselves; outside this band the figures deserve a second look [practice]. */
export const TORQUE_RATIO_BAND = { low: 0.85, high: 1.15 } as const;

/** Copper's temperature coefficient of resistance at 20 °C [IEC 60028]. */
export const COPPER_ALPHA20_PER_K = 0.00393;

/** R = V/Is, ω0 = n0·2π/60, Ke = (V − I0·R)/ω0, Kt = Ke [docs/engineering.md §2]. Throws when the points cannot describe a motor. */
export function motorModelFromDatasheet(points: MotorDatasheetPoints): MotorModel {
  const measured = points.terminalResistanceOhm;
  const resistanceOhm = measured != null && measured > 0 ? measured : points.ratedVoltageV / points.stallCurrentA;
  const noLoadRadPerS = (points.noLoadSpeedRpm * 2 * Math.PI) / 60;
  const keVsPerRad = (points.ratedVoltageV - points.noLoadCurrentA * resistanceOhm) / noLoadRadPerS;
  if (!(resistanceOhm > 0) || !(keVsPerRad > 0) || !Number.isFinite(keVsPerRad)) {
    throw new RangeError('Motor data cannot describe a motor: no-load current must be below stall current and speeds positive.');
  }
  return {
    ratedVoltageV: points.ratedVoltageV,
    resistanceOhm,
    keVsPerRad,
    ktNmPerA: keVsPerRad,
    noLoadCurrentA: points.noLoadCurrentA,
    frictionTorqueNm: keVsPerRad * points.noLoadCurrentA,
  };
}

/** torqueRatio = Ts_datasheet / Ts_pred with Ts_pred = Kt·(Is − I0) at the rated voltage. */
export function checkConsistency(points: MotorDatasheetPoints, model: MotorModel): MotorConsistency {
  const predictedNm = motorAtSupply(model, model.ratedVoltageV).stallTorqueNm;
  const torqueRatio = points.stallTorqueNm / predictedNm;
  if (torqueRatio >= TORQUE_RATIO_BAND.low && torqueRatio <= TORQUE_RATIO_BAND.high) {
    return { torqueRatio, warning: null };
  }
  const percent = Math.round(Math.abs(torqueRatio - 1) * 100);
  const direction = torqueRatio > 1 ? 'higher' : 'lower';
  return {
    torqueRatio,
    warning:
      `The datasheet stall torque is ${percent} % ${direction} than the speed and current figures predict; ` +
      'check the datasheet values (units, rated voltage) or measure the terminal resistance before trusting torque results.',
  };
}

/** The motor re-scaled to a supply V′ with extra series resistance; R, Ke and I0 held [docs/engineering.md §2]. */
export interface MotorAtSupply {
  model: MotorModel;
  supplyV: number;
  seriesResistanceOhm: number;
  totalResistanceOhm: number;
  noLoadSpeedRadPerS: number;
  noLoadSpeedRpm: number;
  stallCurrentA: number;
  stallTorqueNm: number;
}

/** Is′ = V′/(R + Rs) ; ω0′ = (V′ − I0·(R + Rs))/Ke ; Ts′ = Kt·(Is′ − I0); a supply too low to beat friction gives 0. */
export function motorAtSupply(model: MotorModel, supplyV: number, seriesResistanceOhm = 0): MotorAtSupply {
  const totalResistanceOhm = model.resistanceOhm + seriesResistanceOhm;
  const stallCurrentA = supplyV / totalResistanceOhm;
  const noLoadSpeedRadPerS = Math.max(0, (supplyV - model.noLoadCurrentA * totalResistanceOhm) / model.keVsPerRad);
  return {
    model,
    supplyV,
    seriesResistanceOhm,
    totalResistanceOhm,
    noLoadSpeedRadPerS,
    noLoadSpeedRpm: radPerSToRpm(noLoadSpeedRadPerS),
    stallCurrentA,
    stallTorqueNm: Math.max(0, model.ktNmPerA * (stallCurrentA - model.noLoadCurrentA)),
  };
}

/** Winding resistance at another temperature: R(T) = R20·(1 + α20·(T − 20)) [IEC 60028]; the model's R is taken at 20 °C. */
export function windingResistanceOhm(resistanceAt20Ohm: number, windingC: number): number {
  return resistanceAt20Ohm * (1 + COPPER_ALPHA20_PER_K * (windingC - 20));
}

/** Stall current with the winding at windingC (a cold winding draws more) and extra series resistance. */
export function stallCurrentAtWindingA(model: MotorModel, supplyV: number, windingC: number, seriesResistanceOhm = 0): number {
  return supplyV / (windingResistanceOhm(model.resistanceOhm, windingC) + seriesResistanceOhm);
}
