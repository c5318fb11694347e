/**
 * Assembles the answer of POST /api/designs/:id/match from the engineering core's ranking: each candidate
 * gets the catalogue facts a designer and a buyer need (price at the build quantity, lifecycle).
 * Pure: the service loads the parts and passes them in.
 */
import type { DesignInput } from './domain/design.ts';
import type { CandidatePart, Lifecycle, MotorParams, ReviewStatus } from './domain/parts.ts';
import { designCaseOf } from './design-input.ts';
import { rankDesign, type DesignCatalogue, type DesignRanking } from './rank-design.ts';
import { worstCaseOf, type DesignCase, type WorstCase } from './design-case.ts';
import { SCORE_EXPLANATION, sortCandidates, type CandidateResult } from './ranking.ts';
import { bestUnitPrice } from './part-summary.ts';
import { calcMotor, type CalcMotorResponse } from './calc.ts';
import { operatingPointAtSpeed, operatingPointAtTorque } from './motor-curve.ts';
import { motorAtSupply, motorModelFromDatasheet } from './motor.ts';
import type { SupplyReport } from './supply.ts';
import { supplyReportForCase } from './supply-design.ts';

export interface PriceAtQty {
  qty: number;
  unitPrice: number;
  currency: string;
}

export type MatchEntry<T extends CandidateResult = CandidateResult> = T & {
  package: string;
  lifecycle: Lifecycle;
  reviewStatus: ReviewStatus;
  priceAtQty: PriceAtQty | null;
  /** True when a part is chosen for this line and this one comes in another package (a footprint change). */
  footprintChange: boolean;
};

type Ranked = DesignRanking;

export interface MotorView {
  label: string;
  params: MotorParams;
  /** Curves at the minimum and maximum supply, with the design's series resistance. */
  atMin: CalcMotorResponse;
  atMax: CalcMotorResponse;
  /** Full-on operating point at each end (null for a stall-only load). */
  operatingMin: { torqueNm: number; speedRpm: number; currentA: number } | null;
  operatingMax: { torqueNm: number; speedRpm: number; currentA: number } | null;
}

export interface DesignMatch {
  worstCase: Ranked['worstCase'];
  motor: MotorView;
  switch: MatchEntry<Ranked['switch'][number]>[];
  driverNeeded: boolean;
  driverNeededNote: string | null;
  requiredGateDriveV: number | null;
  switchWithDriver: MatchEntry<Ranked['switchWithDriver'][number]>[];
  /** What the effective switch list is judged at (the pin, or the chosen / best real driver). */
  switchDrive: Ranked['switchDrive'];
  driver: MatchEntry<Ranked['driver'][number]>[];
  /** Which diode's VF the currents use. */
  diodeForward: Ranked['diodeForward'];
  /** One line saying what the score weighs. */
  scoreExplanation: string;
  diode: MatchEntry<Ranked['diode'][number]>[];
  powerOn: Ranked['powerOn'];
  /** The source against the motor (start current, current limit, shared logic rail); null until computed. */
  supply: SupplyReport | null;
  cautions: string[];
  /** The cautions not printed beside their own step in the workspace (see rank-design.ts). */
  otherCautions: string[];
  /** Candidates left out before ranking because a rating can never pass (or obsolete). */
  excluded: { switch: number; driver: number; diode: number };
}

/** The candidates a match ranks, and how many were left out before ranking. */
export interface MatchCatalogue extends DesignCatalogue {
  excluded: DesignMatch['excluded'];
}

const LIFECYCLE_RANK: Readonly<Record<Lifecycle, number>> = { active: 0, nrnd: 1, 'last-buy': 2, obsolete: 3 };

/** Ties on verdict and score: the lower price at the build quantity first, then the healthier lifecycle. */
function tiebreak(a: MatchEntry, b: MatchEntry): number {
  const pa = a.priceAtQty?.unitPrice ?? Infinity;
  const pb = b.priceAtQty?.unitPrice ?? Infinity;
  return (pa === pb ? 0 : pa < pb ? -1 : 1) || LIFECYCLE_RANK[a.lifecycle] - LIFECYCLE_RANK[b.lifecycle];
}

function decorate<T extends CandidateResult>(
  results: T[],
  parts: Map<number | undefined, CandidatePart<'mosfet' | 'driver' | 'diode'>>,
  qty: number,
  chosenId: number | null,
): MatchEntry<T>[] {
  const chosenPackage = chosenId == null ? null : (parts.get(chosenId)?.package ?? null);
  const entries = results.map((r) => {
    const part = r.partId == null ? undefined : parts.get(r.partId);
    const price = part ? bestUnitPrice(part, qty) : null;
    return {
      ...r,
      package: part?.package ?? '',
      lifecycle: part?.lifecycle ?? 'active',
      reviewStatus: part?.reviewStatus ?? 'approved',
      priceAtQty: price ? { qty, unitPrice: price.price, currency: price.currency } : null,
      footprintChange: chosenPackage != null && r.partId !== chosenId && (part?.package ?? '') !== chosenPackage,
    };
  });
  return sortCandidates(entries, tiebreak);
}

function operatingPoint(params: MotorParams, input: DesignInput, supplyV: number): MotorView['operatingMin'] {
  const at = motorAtSupply(motorModelFromDatasheet(params), supplyV, input.wiringResistanceOhm + input.shuntResistanceOhm);
  if (input.load.kind === 'stall-only') return null;
  const p = input.load.kind === 'torque' ? operatingPointAtTorque(at, input.load.torqueNm) : operatingPointAtSpeed(at, input.load.speedRpm);
  return { torqueNm: p.torqueNm, speedRpm: p.speedRpm, currentA: p.currentA };
}

export function motorView(label: string, params: MotorParams, input: DesignInput): MotorView {
  const series = input.wiringResistanceOhm + input.shuntResistanceOhm;
  const motor = {
    ratedVoltageV: params.ratedVoltageV,
    noLoadSpeedRpm: params.noLoadSpeedRpm,
    noLoadCurrentA: params.noLoadCurrentA,
    stallCurrentA: params.stallCurrentA,
    stallTorqueNm: params.stallTorqueNm,
    ...(params.terminalResistanceOhm != null ? { terminalResistanceOhm: params.terminalResistanceOhm } : {}),
  };
  return {
    label,
    params,
    atMin: calcMotor({ motor, supplyV: input.supply.minV, seriesResistanceOhm: series, curvePoints: 41 }),
    atMax: calcMotor({ motor, supplyV: input.supply.maxV, seriesResistanceOhm: series, curvePoints: 41 }),
    operatingMin: operatingPoint(params, input, input.supply.minV),
    operatingMax: operatingPoint(params, input, input.supply.maxV),
  };
}

/** The design case and its worst case, worked out once per match (the catalogue narrowing uses them too). */
export interface PreparedCase {
  designCase: DesignCase;
  worstCase: WorstCase;
}

export function prepareCase(input: DesignInput, motor: MotorParams): PreparedCase {
  const designCase = designCaseOf(input, motor);
  return { designCase, worstCase: worstCaseOf(designCase) };
}

/** The engine's ranking for a design (no prices: they only break ties when the match is decorated). */
export function rankForMatch(input: DesignInput, catalogue: DesignCatalogue, prepared: PreparedCase): DesignRanking {
  const sel = input.selections;
  return rankDesign(
    prepared.designCase,
    catalogue,
    {
      switchId: sel.switch.chosenPartId,
      driverId: sel.driver.chosenPartId,
      diodeId: sel.diode.chosenPartId,
      resetStartIntended: input.resetStartIntent != null,
    },
    prepared.worstCase,
  );
}

/** Ranks the catalogue candidates for a design and decorates each with price and lifecycle. */
export function matchDesign(
  input: DesignInput,
  motorLabel: string,
  motor: MotorParams,
  catalogue: MatchCatalogue,
  prepared: PreparedCase = prepareCase(input, motor),
): DesignMatch {
  return matchFromRanking(input, motorLabel, motor, catalogue, prepared, rankForMatch(input, catalogue, prepared));
}

/**
 * The match from a ranking already made: each entry with price and lifecycle, each list ordered with the
 * price at the build quantity as the tie-breaker (parts whose sources are not loaded count as unpriced).
 */
export function matchFromRanking(
  input: DesignInput,
  motorLabel: string,
  motor: MotorParams,
  catalogue: MatchCatalogue,
  prepared: PreparedCase,
  ranking: DesignRanking,
): DesignMatch {
  const { designCase } = prepared;
  const sel = input.selections;
  const qty = input.boardQuantity;
  const all = new Map<number | undefined, CandidatePart<'mosfet' | 'driver' | 'diode'>>(
    [...catalogue.mosfets, ...catalogue.drivers, ...catalogue.diodes].map((p) => [p.id, p]),
  );
  return {
    worstCase: ranking.worstCase,
    motor: motorView(motorLabel, motor, input),
    switch: decorate(ranking.switch, all, qty, sel.switch.chosenPartId),
    driverNeeded: ranking.driverNeeded,
    driverNeededNote: ranking.driverNeededNote,
    requiredGateDriveV: ranking.requiredGateDriveV,
    switchWithDriver: decorate(ranking.switchWithDriver, all, qty, sel.switch.chosenPartId),
    switchDrive: ranking.switchDrive,
    driver: decorate(ranking.driver, all, qty, sel.driver.chosenPartId),
    diode: decorate(ranking.diode, all, qty, sel.diode.chosenPartId),
    diodeForward: ranking.diodeForward,
    scoreExplanation: SCORE_EXPLANATION,
    powerOn: ranking.powerOn,
    supply: supplyReportForCase(designCase),
    cautions: ranking.cautions,
    otherCautions: ranking.otherCautions,
    excluded: catalogue.excluded,
  };
}

/** The switch list the design actually uses: direct-drive candidates, or driver-driven ones when a driver is needed. */
export function effectiveSwitchList(match: DesignMatch): DesignMatch['switch'] {
  return match.driverNeeded ? match.switchWithDriver : match.switch;
}

/** Passing parts first; a part marginal only on margins (no hard limit broken) is still a valid pick. */
export function usableForPick(c: CandidateResult): boolean {
  return c.verdict === 'pass' || (c.verdict === 'marginal' && c.checks.every((x) => x.ok || x.severity === 'margin'));
}

/** Default picks: the best passing part per role and up to three further passing parts as alternates. */
export function suggestSelections(match: DesignMatch): DesignInput['selections'] {
  const pick = (list: CandidateResult[]) => {
    const passing = list.filter((c) => usableForPick(c) && c.partId != null).map((c) => c.partId as number);
    return { chosenPartId: passing[0] ?? null, alternatePartIds: passing.slice(1, 4) };
  };
  return {
    switch: pick(effectiveSwitchList(match)),
    driver: match.driverNeeded ? pick(match.driver) : { chosenPartId: null, alternatePartIds: [] },
    diode: pick(match.diode),
  };
}
