/**
 * Ranks catalogue parts against a design case: pass > marginal > fail always, then score, then MPN.
 * Scores (higher is better, −100…100): switch = share of the thermal budget left,
 * 100·(Tj,lim − Tj)/(Tj,lim − TA) with Tj,lim = Tj,max − margin; driver and diode = 100 × the smallest
 * headroom fraction among their rated checks. Price is deliberately left out.
 */
import { VERDICT_RANK, verdictOf, type Check, type Verdict } from './checks.ts';
import { checkDiode } from './diode-checks.ts';
import type { PartOf } from './domain/parts.ts';
import { marginsOf, worstCaseOf, type DesignCase, type WorstCase } from './design-case.ts';
import { rdsOnPointsAt25C } from './rdson.ts';
import { evaluateSwitch, type SwitchEvaluation, type SwitchMosfetInput, type SwitchOperatingInput } from './switch-evaluation.ts';

export interface CandidateResult {
  partId: number | null;
  mpn: string;
  manufacturer: string;
  verdict: Verdict;
  score: number;
  checks: Check[];
}

export interface SwitchCandidateResult extends CandidateResult {
  evaluation: Omit<SwitchEvaluation, 'checks' | 'verdict'>;
}

/** A gate drive other than the controller pin: minimum output high, its rail maximum and its currents. */
export interface GateDrive {
  voltageV: number;
  sourceCurrentA: number;
  sinkCurrentA: number;
  maxVoltageV?: number;
}

const clampScore = (score: number): number => Math.round(Math.min(100, Math.max(-100, score)) * 10) / 10;

export function sortCandidates<T extends CandidateResult>(results: T[]): T[] {
  return [...results].sort(
    (a, b) => VERDICT_RANK[a.verdict] - VERDICT_RANK[b.verdict] || b.score - a.score || a.mpn.localeCompare(b.mpn),
  );
}

export function switchInputFromPart(part: PartOf<'mosfet'>): SwitchMosfetInput {
  const p = part.params;
  return {
    vdsMaxV: p.vdsMaxV, vgsMaxV: p.vgsMaxV, vgsThMaxV: p.vgsThMaxV, idPulsedA: p.idPulsedA, tjMaxC: p.tjMaxC,
    rthJaCPerW: p.rthJaCPerW, qgTotalNc: p.qgTotalNc, qgdNc: p.qgdNc, qgsNc: p.qgsNc, vPlateauV: p.vPlateauV,
    rdsOn: rdsOnPointsAt25C(p.rdsOn), channel: p.channel,
  };
}

/** The switch's operating values for this case, driven by the controller pin unless a gate drive is given. */
export function switchOperatingFor(c: DesignCase, wc: WorstCase, gateDrive?: GateDrive): SwitchOperatingInput {
  return {
    supplyMaxV: wc.supplyMaxV, runningCurrentA: wc.runningCurrentA, stallCurrentA: wc.stallCurrentMaxA,
    gateDriveV: gateDrive?.voltageV ?? wc.gateDriveMinV,
    gateDriveMaxV: gateDrive ? (gateDrive.maxVoltageV ?? gateDrive.voltageV) : wc.gateDriveMaxV,
    gateDriveCurrentA: gateDrive?.sourceCurrentA ?? c.logic.pinSourceCurrentA,
    gateDriveSinkCurrentA: gateDrive?.sinkCurrentA ?? c.logic.pinSinkCurrentA,
    gateResistanceOhm: c.gateResistanceOhm ?? 0,
    ...(wc.pwmHz != null ? { pwmHz: wc.pwmHz, duty: wc.switchDuty } : {}),
    ambientC: wc.ambientMaxC, diodeForwardV: wc.diodeForwardV,
  };
}

function switchScore(e: SwitchEvaluation, tjMaxC: number, thermalMarginC: number, ambientC: number): number {
  if (e.junctionC == null) return -100;
  const budgetC = tjMaxC - thermalMarginC - ambientC;
  return budgetC > 0 ? clampScore((100 * (tjMaxC - thermalMarginC - e.junctionC)) / budgetC) : -100;
}

/** Evaluates one MOSFET part for the case; P-channel parts get a failing 'channel' check (low-side design). */
export function evaluateSwitchPart(c: DesignCase, part: PartOf<'mosfet'>, gateDrive?: GateDrive, wc: WorstCase = worstCaseOf(c)): SwitchCandidateResult {
  const margins = marginsOf(c);
  const result = evaluateSwitch({ mosfet: switchInputFromPart(part), operating: switchOperatingFor(c, wc, gateDrive), margins });
  return {
    partId: part.id ?? null,
    mpn: part.mpn,
    manufacturer: part.manufacturer,
    verdict: result.verdict,
    score: switchScore(result, part.params.tjMaxC, margins.thermalMarginC, wc.ambientMaxC),
    checks: result.checks,
    evaluation: {
      rdsOnAtDriveOhms: result.rdsOnAtDriveOhms,
      junctionC: result.junctionC,
      conductionLossW: result.conductionLossW,
      switchingLossW: result.switchingLossW,
      gateDrivePowerW: result.gateDrivePowerW,
    },
  };
}

export function rankSwitchCandidates(c: DesignCase, mosfets: PartOf<'mosfet'>[], gateDrive?: GateDrive): SwitchCandidateResult[] {
  const wc = worstCaseOf(c);
  return sortCandidates(mosfets.map((m) => evaluateSwitchPart(c, m, gateDrive, wc)));
}

/** 100 × the smallest headroom among the listed checks, clamped to −100…100. */
export function minMarginScore(checks: readonly Check[], ids: readonly string[]): number {
  const margins = checks.filter((x) => ids.includes(x.id) && x.margin != null).map((x) => x.margin as number);
  return margins.length > 0 ? clampScore(100 * Math.min(...margins)) : 0;
}

const DIODE_SCORED = ['reverse-voltage', 'mean-current', 'peak-current', 'reverse-recovery'] as const;

export function rankDiodeCandidates(c: DesignCase, diodes: PartOf<'diode'>[]): CandidateResult[] {
  const wc = worstCaseOf(c);
  const model = { inductanceH: c.motor.inductanceH, resistanceOhm: c.motor.terminalResistanceOhm ?? c.motor.ratedVoltageV / c.motor.stallCurrentA };
  const results = diodes.map((part): CandidateResult => {
    const checks = checkDiode({
      diode: part.params, supplyMaxV: wc.supplyMaxV, meanCurrentA: wc.diodeMeanCurrentA, peakCurrentA: wc.stallCurrentMaxA,
      pwmHz: wc.pwmHz, voltageDerating: marginsOf(c).voltageDerating,
      motorInductanceH: model.inductanceH, motorResistanceOhm: model.resistanceOhm,
    });
    return { partId: part.id ?? null, mpn: part.mpn, manufacturer: part.manufacturer, verdict: verdictOf(checks), score: minMarginScore(checks, DIODE_SCORED), checks };
  });
  return sortCandidates(results);
}
