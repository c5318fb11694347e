/**
 * One MOSFET against one operating case: the pure core of POST /api/calc/switch [api-contract.md] and of the
 * design ranking. New inputs are optional and default to the worst case (no stall protection, full-on jam).
 */
import { verdictOf, type Check, type Verdict } from './checks.ts';
import {
  checkChannel,
  checkDrainVoltage,
  checkGateDrive,
  checkGateVoltageRating,
  checkJunctionTemperature,
  checkMillerPlateau,
  checkRdsOnTestCurrent,
  checkRunningCurrent,
  checkStallCurrent,
  checkStallThermal,
  checkSwitchingEdges,
  type NoJunctionReason,
} from './mosfet-checks.ts';
import {
  DEFAULT_RDSON_TEMPCO_PER_C,
  governingLineAt,
  lowestSpecVgsV,
  rdsOnAtDriveOhm,
  rdsOnAtTemperatureOhm,
  type RdsOnPoint,
} from './rdson.ts';
import { gateDrivePowerW, switchingChargeNc, switchingLossAtEdgesW, switchingTimes, type SwitchingTimes } from './switching.ts';
import { maxCurrentAtAmbientA, solveConductionJunction, zthAtPulseCPerW, type ZthCurvePoint } from './thermal.ts';

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
  /** Extension: single-pulse Zth points, for a jam cut off after a time. */
  zthPoints?: ZthCurvePoint[] | null;
}

/** What limits a jammed motor: nothing (steady state), a current limit, or a cut-off after a time. */
export type SwitchStallProtection = { kind: 'none' } | { kind: 'current-limit'; limitA: number } | { kind: 'cut-off'; afterS: number };

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
  /** Extension: stall protection; absent = none, so a jam is a steady state at stallCurrentA. */
  stallProtection?: SwitchStallProtection;
  /** Extension: duty commanded while jammed; absent = 1 (full on), the worst case. */
  stallDuty?: number;
  /** Extension: RMS switch current while running when ripple is known (else runningCurrentA·√duty). */
  currentRmsA?: number;
  /** Extension: currents switched at turn-on and turn-off when ripple is known (else runningCurrentA). */
  turnOnCurrentA?: number;
  turnOffCurrentA?: number;
  /** Extension: RMS switch current while jammed, when ripple at stall is known. */
  stallCurrentRmsA?: number;
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
  /** Junction while jammed (null when it runs away or cannot be assessed). */
  stallJunctionC: number | null;
  stallCurrentRmsA: number;
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

interface StallCase {
  protection: SwitchStallProtection;
  duty: number;
  currentA: number;
  currentRmsA: number;
}

/**
 * The jam the switch must survive: under PWM at duty D the motor stalls at Is,pwm = max(0, D·V − (1−D)·V_F)/R with
 * R = V/Is (the loop at the highest supply, coldest winding); a current limit caps it [docs/engineering.md §6].
 */
function stallCaseOf(op: SwitchOperatingInput, pwmHz: number | null): StallCase {
  const protection = op.stallProtection ?? { kind: 'none' };
  const duty = pwmHz == null ? 1 : Math.min(1, Math.max(0, op.stallDuty ?? 1));
  const loopOhm = op.stallCurrentA > 0 ? op.supplyMaxV / op.stallCurrentA : Infinity;
  const jamA = duty >= 1 ? op.stallCurrentA : Math.max(0, duty * op.supplyMaxV - (1 - duty) * op.diodeForwardV) / loopOhm;
  const currentA = protection.kind === 'current-limit' ? Math.min(protection.limitA, jamA) : jamA;
  const rmsFromModel = currentA * Math.sqrt(duty);
  const currentRmsA = op.stallCurrentRmsA != null && protection.kind !== 'current-limit' ? op.stallCurrentRmsA : rmsFromModel;
  return { protection, duty, currentA, currentRmsA };
}

/** The jam judged for the switch: its check and the junction it reaches (null when it runs away or cannot be assessed). */
function stallThermalCheck(
  m: SwitchMosfetInput,
  op: SwitchOperatingInput,
  s: StallCase,
  rdsOn25: number | null,
  alpha: number,
  edges: SwitchingTimes,
  pwmHz: number | null,
): { check: Check; junctionC: number | null } {
  if (rdsOn25 == null) {
    const check = checkStallThermal({
      protection: s.protection.kind,
      currentRmsA: s.currentRmsA,
      tjMaxC: m.tjMaxC,
      ambientC: op.ambientC,
      junctionC: null,
      notCharacterised: true,
    });
    return { check, junctionC: null };
  }
  const cutOff = s.protection.kind === 'cut-off' ? s.protection.afterS : null;
  const usedZth = cutOff != null && (m.zthPoints?.length ?? 0) > 0;
  const rthCPerW = usedZth ? zthAtPulseCPerW(m.zthPoints ?? [], cutOff as number, m.rthJaCPerW) : m.rthJaCPerW;
  const clampV = op.supplyMaxV + op.diodeForwardV;
  const swW = pwmHz != null && s.duty < 1 ? switchingLossAtEdgesW(clampV, s.currentA, s.currentA, edges.turnOnS, edges.turnOffS, pwmHz) : 0;
  const junctionC = Number.isFinite(swW)
    ? solveConductionJunction({
        ambientC: op.ambientC,
        rthJaCPerW: rthCPerW,
        currentRmsA: s.currentRmsA,
        rdsOn25Ohm: rdsOn25,
        alphaPerC: alpha,
        otherLossW: swW,
      }).junctionC
    : null;
  const check = checkStallThermal({
    protection: s.protection.kind,
    currentRmsA: s.currentRmsA,
    tjMaxC: m.tjMaxC,
    ambientC: op.ambientC,
    junctionC,
    afterS: cutOff ?? undefined,
    usedZth,
  });
  return { check, junctionC };
}

export function evaluateSwitch(input: SwitchEvaluationInput): SwitchEvaluation {
  const { mosfet: m, operating: op } = input;
  const given = input.margins;
  const margins: SwitchMargins =
    given?.voltageDerating != null && given.thermalMarginC != null ? (given as SwitchMargins) : { ...DEFAULT_MARGINS, ...given };
  const alpha = m.rdsOnTempCoeffPerC ?? DEFAULT_RDSON_TEMPCO_PER_C;
  const pwm = pwmOf(op);
  const rdsOnAtDriveOhms = rdsOnAtDriveOhm(m.rdsOn, op.gateDriveV);
  const edges = edgeTimes(m, op);
  const currentRmsA = op.currentRmsA ?? op.runningCurrentA * Math.sqrt(pwm.duty);
  const turnOnA = op.turnOnCurrentA ?? op.runningCurrentA;
  const turnOffA = op.turnOffCurrentA ?? op.runningCurrentA;
  const clampV = op.supplyMaxV + op.diodeForwardV;
  const swLossW = pwm.hz == null ? 0 : switchingLossAtEdgesW(clampV, turnOnA, turnOffA, edges.turnOnS, edges.turnOffS, pwm.hz);
  // A drive that never crosses the plateau leaves the part in its linear region: no steady state to report.
  const thermal =
    rdsOnAtDriveOhms == null || !Number.isFinite(swLossW)
      ? null
      : solveConductionJunction({
          ambientC: op.ambientC,
          rthJaCPerW: m.rthJaCPerW,
          currentRmsA,
          rdsOn25Ohm: rdsOnAtDriveOhms,
          alphaPerC: alpha,
          otherLossW: swLossW,
        });
  const maxCurrentA =
    rdsOnAtDriveOhms == null
      ? null
      : maxCurrentAtAmbientA(m.tjMaxC, op.ambientC, m.rthJaCPerW, rdsOnAtTemperatureOhm(rdsOnAtDriveOhms, m.tjMaxC, alpha));
  const stallCase = stallCaseOf(op, pwm.hz);
  const stall = stallThermalCheck(m, op, stallCase, rdsOnAtDriveOhms, alpha, edges, pwm.hz);
  const worstCurrentA = Math.max(turnOffA, op.runningCurrentA, stallCase.currentA);
  const checks: Check[] = [
    checkDrainVoltage(m.vdsMaxV, op.supplyMaxV, op.diodeForwardV, margins.voltageDerating),
    checkGateVoltageRating(op.gateDriveMaxV ?? op.gateDriveV, m.vgsMaxV),
    checkGateDrive(op.gateDriveV, lowestSpecVgsV(m.rdsOn), m.vgsThMaxV, m.vgsMaxV, rdsOnAtDriveOhms),
    checkMillerPlateau(op.gateDriveV, m.vPlateauV, m.vgsThMaxV),
    checkRdsOnTestCurrent(op.gateDriveV, m.vgsThMaxV, governingLineAt(m.rdsOn, op.gateDriveV), worstCurrentA),
    checkStallCurrent(op.stallCurrentA, m.idPulsedA),
    checkRunningCurrent(currentRmsA, maxCurrentA, op.ambientC),
    checkJunctionTemperature(
      thermal?.junctionC ?? null,
      m.tjMaxC,
      margins.thermalMarginC,
      op.ambientC,
      noJunctionReason(rdsOnAtDriveOhms, swLossW),
    ),
    stall.check,
    checkSwitchingEdges(edges.turnOnS, edges.turnOffS, pwm.hz),
  ];
  if (m.channel === 'p') checks.unshift(checkChannel('p'));
  return {
    verdict: verdictOf(checks),
    rdsOnAtDriveOhms,
    junctionC: thermal?.junctionC ?? null,
    conductionLossW: thermal?.conductionLossW ?? null,
    switchingLossW: Number.isFinite(swLossW) ? swLossW : null,
    gateDrivePowerW: pwm.hz == null ? 0 : gateDrivePowerW(m.qgTotalNc, op.gateDriveV, pwm.hz),
    stallJunctionC: stall.junctionC,
    stallCurrentRmsA: stallCase.currentRmsA,
    checks,
  };
}
