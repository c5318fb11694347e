/**
 * Assembles the answer of POST /api/designs/:id/match from the engineering core's ranking: each candidate
 * gets the catalogue facts a designer and a buyer need (price at the build quantity, lifecycle).
 * Pure: the service loads the parts and passes them in.
 */
import type { DesignInput } from './domain/design.ts';
import type { CandidatePart, Lifecycle, MotorParams, ReviewStatus } from './domain/parts.ts';
import { designCaseOf } from './design-input.ts';
import {
  rankDesign,
  rankDesignLean,
  rankDesignLeanSteps,
  type DesignCatalogue,
  type DesignPicks,
  type DesignRanking,
  type RankingJudges,
} from './rank-design.ts';
import { worstCaseOf, type DesignCase, type WorstCase } from './design-case.ts';
import { SLICE_PARTS, type Steps } from './slices.ts';
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
  return cheaperThenHealthier(a.priceAtQty?.unitPrice ?? Infinity, a.lifecycle, b.priceAtQty?.unitPrice ?? Infinity, b.lifecycle);
}

/** The tie-break itself: the lower unit price first (unpriced = Infinity, last), then the healthier lifecycle. */
function cheaperThenHealthier(pa: number, la: Lifecycle, pb: number, lb: Lifecycle): number {
  return (pa === pb ? 0 : pa < pb ? -1 : 1) || LIFECYCLE_RANK[la] - LIFECYCLE_RANK[lb];
}

/**
 * A ranked list is sorted on verdict and score; its runs of equal verdict and score are the ties a price
 * can reorder. This gives where the run starting at `start` ends (exclusive), read in place: a match walks
 * lists of 24,000–65,000 entries, most of them runs of one.
 */
export function tieEnd(list: readonly { verdict: string; score: number }[], start: number): number {
  const first = list[start];
  let end = start + 1;
  while (end < list.length && list[end].verdict === first.verdict && list[end].score === first.score) end++;
  return end;
}

type AnyCandidatePart = CandidatePart<'mosfet' | 'driver' | 'diode'>;

/** One result with its part's catalogue facts: package, lifecycle, review, price at `qty`, footprint change. */
export function decorateEntry<T extends CandidateResult>(
  r: T,
  part: AnyCandidatePart | undefined,
  qty: number,
  chosenId: number | null,
  chosenPackage: string | null,
): MatchEntry<T> {
  const price = part ? bestUnitPrice(part, qty) : null;
  return {
    ...r,
    package: part?.package ?? '',
    lifecycle: part?.lifecycle ?? 'active',
    reviewStatus: part?.reviewStatus ?? 'approved',
    priceAtQty: price ? { qty, unitPrice: price.price, currency: price.currency } : null,
    footprintChange: chosenPackage != null && r.partId !== chosenId && (part?.package ?? '') !== chosenPackage,
  };
}

/** The package of the chosen part of a line (null when none is chosen). */
export function chosenPackageOf(parts: Map<number | undefined, AnyCandidatePart>, chosenId: number | null): string | null {
  return chosenId == null ? null : (parts.get(chosenId)?.package ?? null);
}

/**
 * The order the match lists take: the engine's (verdict, score, MPN) with price at the build quantity,
 * then lifecycle, breaking ties of verdict and score (the same as sorting on all of them at once).
 * `visible`: when given, only the tie groups holding one of these parts are put in that order; the rest keep
 * the engine's order. A page passes the parts whose place can show (idsNeedingPrice): a group holding none
 * of them sits at the same ranks whatever its inner order, and the page never shows it.
 */
export function matchOrder<T extends CandidateResult>(
  ranked: readonly T[],
  parts: Map<number | undefined, AnyCandidatePart>,
  qty: number,
  visible?: ReadonlySet<number>,
): T[] {
  const priceOf = (e: T) => {
    const part = e.partId == null ? undefined : parts.get(e.partId);
    return (part && part.sources.length > 0 ? bestUnitPrice(part, qty)?.price : undefined) ?? Infinity;
  };
  const lifecycleOf = (e: T): Lifecycle => (e.partId == null ? undefined : parts.get(e.partId))?.lifecycle ?? 'active';
  const shows = (start: number, end: number): boolean => {
    if (!visible) return true;
    for (let i = start; i < end; i++) if (ranked[i].partId != null && visible.has(ranked[i].partId as number)) return true;
    return false;
  };
  const out = ranked.slice();
  for (let start = 0; start < ranked.length;) {
    const end = tieEnd(ranked, start);
    if (end - start > 1 && shows(start, end)) {
      const keyed = ranked.slice(start, end).map((e) => ({ e, price: priceOf(e), life: lifecycleOf(e) }));
      // Stable: within equal price and lifecycle the engine's MPN order stays.
      keyed.sort((a, b) => cheaperThenHealthier(a.price, a.life, b.price, b.life));
      for (let i = 0; i < keyed.length; i++) out[start + i] = keyed[i].e;
    }
    start = end;
  }
  return out;
}

function decorate<T extends CandidateResult>(
  results: T[],
  parts: Map<number | undefined, AnyCandidatePart>,
  qty: number,
  chosenId: number | null,
): MatchEntry<T>[] {
  const chosenPackage = chosenPackageOf(parts, chosenId);
  const entries = results.map((r) => decorateEntry(r, r.partId == null ? undefined : parts.get(r.partId), qty, chosenId, chosenPackage));
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
  return rankDesign(prepared.designCase, catalogue, picksOf(input), prepared.worstCase);
}

/** The designer's picks as the ranking takes them. */
function picksOf(input: DesignInput): DesignPicks {
  const sel = input.selections;
  return {
    switchId: sel.switch.chosenPartId,
    driverId: sel.driver.chosenPartId,
    diodeId: sel.diode.chosenPartId,
    resetStartIntended: input.resetStartIntent != null,
  };
}

/** rankForMatchLean in slices (rankDesignLeanSteps): the match pages run it pausing between slices. */
export function rankForMatchLeanSteps(
  input: DesignInput,
  catalogue: DesignCatalogue,
  prepared: PreparedCase,
  earlier?: { catalogue: DesignCatalogue; ranking: DesignRanking },
): Steps<{ ranking: DesignRanking; judges: RankingJudges }> {
  // The match's first drive phase may have ranked the same diodes for the same case: then its diode list carries over.
  const diodes = earlier && { diodes: earlier.catalogue.diodes, ranking: earlier.ranking };
  return rankDesignLeanSteps(prepared.designCase, catalogue, picksOf(input), prepared.worstCase, SLICE_PARTS, diodes);
}

/** rankForMatch kept lean (rankDesignLean): for the match pages, which judge in full only what they show. */
export function rankForMatchLean(
  input: DesignInput,
  catalogue: DesignCatalogue,
  prepared: PreparedCase,
): { ranking: DesignRanking; judges: RankingJudges } {
  return rankDesignLean(prepared.designCase, catalogue, picksOf(input), prepared.worstCase);
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
  const sel = input.selections;
  const qty = input.boardQuantity;
  const all = catalogueParts(catalogue);
  return {
    ...matchHead(input, motorLabel, motor, catalogue, prepared, ranking),
    switch: decorate(ranking.switch, all, qty, sel.switch.chosenPartId),
    switchWithDriver: decorate(ranking.switchWithDriver, all, qty, sel.switch.chosenPartId),
    driver: decorate(ranking.driver, all, qty, sel.driver.chosenPartId),
    diode: decorate(ranking.diode, all, qty, sel.diode.chosenPartId),
  };
}

/** Every candidate of a catalogue by id. */
export function catalogueParts(catalogue: DesignCatalogue): Map<number | undefined, AnyCandidatePart> {
  return new Map<number | undefined, AnyCandidatePart>(
    [...catalogue.mosfets, ...catalogue.drivers, ...catalogue.diodes].map((p) => [p.id, p]),
  );
}

/** Everything in a match besides its four lists. */
export function matchHead(
  input: DesignInput,
  motorLabel: string,
  motor: MotorParams,
  catalogue: MatchCatalogue,
  prepared: PreparedCase,
  ranking: DesignRanking,
): Omit<DesignMatch, 'switch' | 'switchWithDriver' | 'driver' | 'diode'> {
  return {
    worstCase: ranking.worstCase,
    motor: motorView(motorLabel, motor, input),
    driverNeeded: ranking.driverNeeded,
    driverNeededNote: ranking.driverNeededNote,
    requiredGateDriveV: ranking.requiredGateDriveV,
    switchDrive: ranking.switchDrive,
    diodeForward: ranking.diodeForward,
    scoreExplanation: SCORE_EXPLANATION,
    powerOn: ranking.powerOn,
    supply: supplyReportForCase(prepared.designCase),
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

/** The four lists of a match as suggestSelections reads them (full or lean entries). */
export interface MatchLists {
  driverNeeded: boolean;
  switch: readonly CandidateResult[];
  switchWithDriver: readonly CandidateResult[];
  driver: readonly CandidateResult[];
  diode: readonly CandidateResult[];
}

/** Default picks: the best passing part per role and up to three further passing parts as alternates. */
export function suggestSelections(match: MatchLists): DesignInput['selections'] {
  const pick = (list: readonly CandidateResult[]) => {
    const passing = list.filter((c) => usableForPick(c) && c.partId != null).map((c) => c.partId as number);
    return { chosenPartId: passing[0] ?? null, alternatePartIds: passing.slice(1, 4) };
  };
  return {
    switch: pick(match.driverNeeded ? match.switchWithDriver : match.switch),
    driver: match.driverNeeded ? pick(match.driver) : { chosenPartId: null, alternatePartIds: [] },
    diode: pick(match.diode),
  };
}
