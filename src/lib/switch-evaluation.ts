/**
 * One MOSFET against one operating case: the pure core of POST /api/calc/switch [api-contract.md].
 */
import { verdictOf, type Check, type Verdict } from './checks.ts';
import {
  checkChannel, checkDrainVoltage, checkGateDrive, checkGateVoltageRating, checkJunctionTemperature,
  checkRunningCurrent, checkStallCurrent, checkSwitchingEdges, type NoJunctionReason,
} from './mosfet-checks.ts';
import { DEFAULT_RDSON_TEMPCO_PER_C, lowestSpecVgsV, rdsOnAtDriveOhm, rdsOnAtTemperatureOhm, type RdsOnPoint } from './rdson.ts';
import { gateDrivePowerW, switchingChargeNc, switchingLossW, switchingTimes, type SwitchingTimes } from './switching.ts';
import { maxCurrentAtAmbientA, solveConductionJunction } from './thermal.ts';

export interface SwitchMosfetInput {
  vdsMaxV: number;
  vgsMaxV: number;
  vgsThMaxV: number;
  idPulsedA: number;
  tjMaxC: number;
  rthJaCPerW: number;
  qgTotalNc: number;
  qgdNc?: number | null;
  qgsNc?: number | null;
  vPlateauV?: number | null;
  rdsOn: RdsOnPoint[];
  rdsOnTempCoeffPerC?: number | null;
  /** Extension: absent means N-channel. */
  channel?: 'n' | 'p';
}

export interface SwitchOperatingInput {
  supplyMaxV: number;
  runningCurrentA: number;
  stallCurrentA: number;
  /** The lowest gate-drive high level (worst case for enhancement). */
  gateDriveV: number;
  /** Source current the gate drive can deliver. */
  gateDriveCurrentA: number;
  gateResistanceOhm?: number;
  pwmHz?: number;
  duty?: number;
  ambientC: number;
  diodeForwardV: number;
  /** Extension: sink current when it differs from the source current. */
  gateDriveSinkCurrentA?: number;
  /** Extension: the highest level the gate can see (for VGS(max)); defaults to gateDriveV. */
  gateDriveMaxV?: number;
}

export interface SwitchMargins {
  voltageDerating: number;
  thermalMarginC: number;
}

/** Voltage derating 0.8 and 25 K below Tj,max [practice]. */
export const DEFAULT_MARGINS: Readonly<SwitchMargins> = { voltageDerating: 0.8, thermalMarginC: 25 };

export interface SwitchEvaluationInput {
  mosfet: SwitchMosfetInput;
  operating: SwitchOperatingInput;
  margins?: Partial<SwitchMargins>;
}

export interface SwitchEvaluation {
  verdict: Verdict;
  rdsOnAtDriveOhms: number | null;
  junctionC: number | null;
  conductionLossW: number | null;
  /** Null when the drive never reaches the Miller plateau (edges never finish). */
  switchingLossW: number | null;
  gateDrivePowerW: number;
  checks: Check[];
}

/** PWM when a frequency is given; duty defaults to 1 (always on) when only the frequency is. */
function pwmOf(op: SwitchOperatingInput): { hz: number | null; duty: number } {
  const hz = op.pwmHz != null && op.pwmHz > 0 ? op.pwmHz : null;
  return { hz, duty: hz == null ? 1 : Math.min(1, Math.max(0, op.duty ?? 1)) };
}

function edgeTimes(m: SwitchMosfetInput, op: SwitchOperatingInput): SwitchingTimes {
  return switchingTimes({
    switchingChargeNc: switchingChargeNc(m.qgTotalNc, m.qgdNc, m.qgsNc),
    driveV: op.gateDriveV,
    // Without a stated plateau, VGS(th) max stands in for it (the plateau sits just above threshold).
    plateauV: m.vPlateauV ?? m.vgsThMaxV,
    gateResistanceOhm: op.gateResistanceOhm ?? 0,
    sourceLimitA: op.gateDriveCurrentA,
    sinkLimitA: op.gateDriveSinkCurrentA ?? op.gateDriveCurrentA,
  });
}

function noJunctionReason(rdsOnAtDriveOhms: number | null, switchingLossW: number): NoJunctionReason {
  if (rdsOnAtDriveOhms == null) return 'not-characterised';
  return Number.isFinite(switchingLossW) ? 'runaway' : 'linear';
}

export function evaluateSwitch(input: SwitchEvaluationInput): SwitchEvaluation {
  const { mosfet: m, operating: op } = input;
  const margins = { ...DEFAULT_MARGINS, ...input.margins };
  const alpha = m.rdsOnTempCoeffPerC ?? DEFAULT_RDSON_TEMPCO_PER_C;
  const pwm = pwmOf(op);
  const rdsOnAtDriveOhms = rdsOnAtDriveOhm(m.rdsOn, op.gateDriveV);
  const edges = edgeTimes(m, op);
  const currentRmsA = op.runningCurrentA * Math.sqrt(pwm.duty);
  const clampV = op.supplyMaxV + op.diodeForwardV;
  const swLossW = pwm.hz == null ? 0 : switchingLossW(clampV, op.runningCurrentA, edges.turnOnS, edges.turnOffS, pwm.hz);
  // A drive that never crosses the plateau leaves the part in its linear region: no steady state to report.
  const thermal = rdsOnAtDriveOhms == null || !Number.isFinite(swLossW)
    ? null
    : solveConductionJunction({ ambientC: op.ambientC, rthJaCPerW: m.rthJaCPerW, currentRmsA, rdsOn25Ohm: rdsOnAtDriveOhms, alphaPerC: alpha, otherLossW: swLossW });
  const maxCurrentA = rdsOnAtDriveOhms == null
    ? null
    : maxCurrentAtAmbientA(m.tjMaxC, op.ambientC, m.rthJaCPerW, rdsOnAtTemperatureOhm(rdsOnAtDriveOhms, m.tjMaxC, alpha));
  const checks: Check[] = [
    ...(m.channel === 'p' ? [checkChannel('p')] : []),
    checkDrainVoltage(m.vdsMaxV, op.supplyMaxV, op.diodeForwardV, margins.voltageDerating),
    checkGateVoltageRating(op.gateDriveMaxV ?? op.gateDriveV, m.vgsMaxV),
    checkGateDrive(op.gateDriveV, lowestSpecVgsV(m.rdsOn), m.vgsThMaxV, m.vgsMaxV, rdsOnAtDriveOhms),
    checkStallCurrent(op.stallCurrentA, m.idPulsedA),
    checkRunningCurrent(currentRmsA, maxCurrentA, op.ambientC),
    checkJunctionTemperature(thermal?.junctionC ?? null, m.tjMaxC, margins.thermalMarginC, op.ambientC, noJunctionReason(rdsOnAtDriveOhms, swLossW)),
    checkSwitchingEdges(edges.turnOnS, edges.turnOffS, pwm.hz),
  ];
  return {
    verdict: verdictOf(checks),
    rdsOnAtDriveOhms,
    junctionC: thermal?.junctionC ?? null,
    conductionLossW: thermal?.conductionLossW ?? null,
    switchingLossW: Number.isFinite(swLossW) ? swLossW : null,
    gateDrivePowerW: pwm.hz == null ? 0 : gateDrivePowerW(m.qgTotalNc, op.gateDriveV, pwm.hz),
    checks,
  };
}
