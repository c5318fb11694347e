/**
 * The calculators behind POST /api/calc/*: validated bodies in, contract response shapes out [api-contract.md].
 */
import { checkConsistency, motorAtSupply, motorModelFromDatasheet, type MotorConsistency } from './motor.ts';
import { maxEfficiencyPoint, maxPowerPoint, motorCurve } from './motor-curve.ts';
import { sizePullResistor, type PullResistorResult } from './pull-resistor.ts';
import type { CalcMotorRequest, CalcPullResistorRequest, CalcSwitchRequest } from './schemas/calc.ts';
import { evaluateSwitch, type SwitchEvaluation } from './switch-evaluation.ts';

export interface CalcMotorCurvePoint {
  torqueNm: number;
  speedRpm: number;
  currentA: number;
  powerW: number;
  efficiency: number;
}

export interface CalcMotorResponse {
  resistanceOhm: number;
  keVsPerRad: number;
  ktNmPerA: number;
  frictionTorqueNm: number;
  consistency: MotorConsistency;
  atSupply: {
    supplyV: number;
    noLoadSpeedRpm: number;
    stallCurrentA: number;
    stallTorqueNm: number;
    maxPower: { torqueNm: number; speedRpm: number; currentA: number; powerW: number };
    maxEfficiency: { torqueNm: number; speedRpm: number; currentA: number; efficiency: number };
  };
  curve: CalcMotorCurvePoint[];
}

export function calcMotor(body: CalcMotorRequest): CalcMotorResponse {
  const model = motorModelFromDatasheet(body.motor);
  const at = motorAtSupply(model, body.supplyV, body.seriesResistanceOhm ?? 0);
  const pMax = maxPowerPoint(at);
  const eMax = maxEfficiencyPoint(at);
  return {
    resistanceOhm: model.resistanceOhm,
    keVsPerRad: model.keVsPerRad,
    ktNmPerA: model.ktNmPerA,
    frictionTorqueNm: model.frictionTorqueNm,
    consistency: checkConsistency(body.motor, model),
    atSupply: {
      supplyV: at.supplyV,
      noLoadSpeedRpm: at.noLoadSpeedRpm,
      stallCurrentA: at.stallCurrentA,
      stallTorqueNm: at.stallTorqueNm,
      maxPower: { torqueNm: pMax.torqueNm, speedRpm: pMax.speedRpm, currentA: pMax.currentA, powerW: pMax.powerW },
      maxEfficiency: { torqueNm: eMax.torqueNm, speedRpm: eMax.speedRpm, currentA: eMax.currentA, efficiency: eMax.efficiency },
    },
    curve: motorCurve(at, body.curvePoints ?? 21).map(({ torqueNm, speedRpm, currentA, powerW, efficiency }) => ({
      torqueNm,
      speedRpm,
      currentA,
      powerW,
      efficiency,
    })),
  };
}

export function calcPullResistor(body: CalcPullResistorRequest): PullResistorResult {
  return sizePullResistor(body);
}

export function calcSwitch(body: CalcSwitchRequest): SwitchEvaluation {
  return evaluateSwitch(body);
}
