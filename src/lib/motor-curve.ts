/**
 * Operating points, curves, maximum-power and maximum-efficiency points of a re-scaled motor
 * [docs/engineering.md §2: I = I0 + T/Kt ; ω = ω0·(1 − T/Ts) ; P = T·ω ; η = P/(V·I)].
 */
import type { MotorAtSupply } from './motor.ts';
import { radPerSToRpm, rpmToRadPerS } from './units.ts';

export interface MotorOperatingPoint {
  torqueNm: number;
  speedRpm: number;
  currentA: number;
  powerW: number;
  efficiency: number;
  /** True when the load torque reaches or exceeds the stall torque at this supply. */
  stalled: boolean;
}

function pointFromTorqueAndSpeed(at: MotorAtSupply, torqueNm: number, speedRadPerS: number, stalled: boolean): MotorOperatingPoint {
  const currentA = stalled ? at.stallCurrentA : at.model.noLoadCurrentA + torqueNm / at.model.ktNmPerA;
  const powerW = torqueNm * speedRadPerS;
  const inputW = at.supplyV * currentA;
  return {
    torqueNm,
    speedRpm: radPerSToRpm(speedRadPerS),
    currentA,
    powerW,
    efficiency: inputW > 0 ? powerW / inputW : 0,
    stalled,
  };
}

/** Operating point at a load torque; a load at or above the stall torque stalls the motor. */
export function operatingPointAtTorque(at: MotorAtSupply, loadTorqueNm: number): MotorOperatingPoint {
  const torqueNm = Math.max(0, loadTorqueNm);
  if (at.stallTorqueNm <= 0 || torqueNm >= at.stallTorqueNm) {
    return pointFromTorqueAndSpeed(at, Math.min(torqueNm, at.stallTorqueNm), 0, true);
  }
  const speedRadPerS = at.noLoadSpeedRadPerS * (1 - torqueNm / at.stallTorqueNm);
  return pointFromTorqueAndSpeed(at, torqueNm, speedRadPerS, false);
}

/** Operating point at a shaft speed; speeds above no-load are clamped to no-load (the motor cannot drive them). */
export function operatingPointAtSpeed(at: MotorAtSupply, speedRpm: number): MotorOperatingPoint {
  if (at.noLoadSpeedRadPerS <= 0) return pointFromTorqueAndSpeed(at, at.stallTorqueNm, 0, true);
  const speedRadPerS = Math.min(Math.max(0, rpmToRadPerS(speedRpm)), at.noLoadSpeedRadPerS);
  const torqueNm = at.stallTorqueNm * (1 - speedRadPerS / at.noLoadSpeedRadPerS);
  return pointFromTorqueAndSpeed(at, torqueNm, speedRadPerS, speedRadPerS === 0);
}

/** Evenly spaced points over 0 ≤ T ≤ Ts (at least two). */
export function motorCurve(at: MotorAtSupply, pointCount = 21): MotorOperatingPoint[] {
  const count = Math.max(2, Math.round(pointCount));
  return Array.from({ length: count }, (_, i) => operatingPointAtTorque(at, (at.stallTorqueNm * i) / (count - 1)));
}

/** P_max at T = Ts/2, ω = ω0/2, I = (I0 + Is)/2, P = Ts·ω0/4 [docs/engineering.md §2]. */
export function maxPowerPoint(at: MotorAtSupply): MotorOperatingPoint {
  return operatingPointAtTorque(at, at.stallTorqueNm / 2);
}

/** η_max at I = √(I0·Is), η = (1 − √(I0/Is))² [docs/engineering.md §2]. */
export function maxEfficiencyPoint(at: MotorAtSupply): MotorOperatingPoint {
  const currentA = Math.sqrt(at.model.noLoadCurrentA * at.stallCurrentA);
  const torqueNm = Math.max(0, at.model.ktNmPerA * (currentA - at.model.noLoadCurrentA));
  return operatingPointAtTorque(at, torqueNm);
}
