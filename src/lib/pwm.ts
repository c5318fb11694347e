/**
 * PWM of a low-side switch with a freewheel diode, continuous conduction [docs/engineering.md §4].
 */
import { motorAtSupply, type MotorModel } from './motor.ts';
import { operatingPointAtSpeed, operatingPointAtTorque, type MotorOperatingPoint } from './motor-curve.ts';

/** V_mean ≈ D·V − (1 − D)·V_F: during the off time the diode holds the motor at −V_F. */
export function meanMotorVoltageV(supplyV: number, duty: number, diodeForwardV: number): number {
  return duty * supplyV - (1 - duty) * diodeForwardV;
}

export type MotorLoad = { kind: 'torque'; torqueNm: number } | { kind: 'speed'; speedRpm: number } | { kind: 'stall-only' };

/** The motor's operating point at the mean voltage; a stall-only load is the stall point. */
export function pwmOperatingPoint(
  model: MotorModel,
  supplyV: number,
  duty: number,
  diodeForwardV: number,
  load: MotorLoad,
  seriesResistanceOhm = 0,
): MotorOperatingPoint {
  const meanV = Math.max(0, meanMotorVoltageV(supplyV, duty, diodeForwardV));
  const at = motorAtSupply(model, meanV, seriesResistanceOhm);
  if (load.kind === 'torque') return operatingPointAtTorque(at, load.torqueNm);
  if (load.kind === 'speed') return operatingPointAtSpeed(at, load.speedRpm);
  return operatingPointAtTorque(at, Number.POSITIVE_INFINITY);
}

export interface PwmCurrents {
  supplyMeanA: number;
  diodeMeanA: number;
  switchRmsA: number;
}

/** Supply D·I ; diode (1 − D)·I ; switch I_rms² = D·(I² + ΔI²/12) [docs/engineering.md §4]. */
export function pwmCurrents(motorMeanA: number, duty: number, rippleA = 0): PwmCurrents {
  return {
    supplyMeanA: duty * motorMeanA,
    diodeMeanA: (1 - duty) * motorMeanA,
    switchRmsA: Math.sqrt(duty * (motorMeanA ** 2 + rippleA ** 2 / 12)),
  };
}

/**
 * Peak-to-peak ripple with τe = L/R: ΔI = (V/R)·(1 − a)(1 − b)/(1 − a·b),
 * a = e^(−D/(f·τe)), b = e^(−(1 − D)/(f·τe)) [docs/engineering.md §4].
 */
export function rippleExactA(supplyV: number, resistanceOhm: number, inductanceH: number, duty: number, frequencyHz: number): number {
  if (duty <= 0 || duty >= 1) return 0;
  const periodsPerTau = frequencyHz * (inductanceH / resistanceOhm);
  const a = Math.exp(-duty / periodsPerTau);
  const b = Math.exp(-(1 - duty) / periodsPerTau);
  return ((supplyV / resistanceOhm) * (1 - a) * (1 - b)) / (1 - a * b);
}

/** For f·τe ≫ 1: ΔI ≈ V·D·(1 − D)/(L·f) [docs/engineering.md §4]. */
export function rippleApproxA(supplyV: number, inductanceH: number, duty: number, frequencyHz: number): number {
  return (supplyV * duty * (1 - duty)) / (inductanceH * frequencyHz);
}

/** Worst case of the approximation, at D = 0.5: V/(4·L·f). */
export function rippleMaxApproxA(supplyV: number, inductanceH: number, frequencyHz: number): number {
  return supplyV / (4 * inductanceH * frequencyHz);
}
