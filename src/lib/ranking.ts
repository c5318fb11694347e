/**
 * Ranks catalogue parts against a design case: pass > marginal > fail always, then score, then (in the match,
 * where prices are known) price at the build quantity and lifecycle, then MPN.
 * One score for every role, 0–100: 100 × the smallest headroom among the part's rated checks (each headroom a
 * fraction of the limit it is judged against), clamped to 0–100; a failing part scores 0 [docs/engineering.md §10].
 */
import { VERDICT_RANK, verdictOf, withoutNotes, type Check, type Verdict } from './checks.ts';
import { checkDiode } from './diode-checks.ts';
import type { CandidatePart, DiodeParams } from './domain/parts.ts';
import { marginsOf, worstCaseOf, type DesignCase, type WorstCase } from './design-case.ts';
import { memoOnObject } from './memo.ts';
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

/** A diode's result with the part's own figures the candidate table shows (they vary per row; the design's needs do not). */
export interface DiodeCandidateResult extends CandidateResult {
  diode: Pick<DiodeParams, 'kind' | 'vrrmV' | 'ifAvA' | 'vfV' | 'trrNs'>;
}

export interface SwitchCandidateResult extends CandidateResult {
  evaluation: Omit<SwitchEvaluation, 'checks' | 'verdict'>;
  /** The gate drive the switch was judged at. */
  drive: {
    gateV: number;
    sourceCurrentA: number;
    sinkCurrentA: number;
    by: 'pin' | 'driver';
    driverPartId: number | null;
    driverMpn: string | null;
  };
}

/** A gate drive other than the bare controller pin: a real driver's output high at its lowest supply, and its currents. */
export interface GateDrive {
  voltageV: number;
  sourceCurrentA: number;
  sinkCurrentA: number;
  maxVoltageV?: number;
  /** The catalogue driver delivering it; null for the controller pin itself. */
  driverPartId?: number | null;
  driverMpn?: string | null;
}

/** The line the workspace shows beside every list. */
export const SCORE_EXPLANATION =
  'Score 0–100: the smallest headroom among the part’s rated checks, as a share of each limit (100 = far ' +
  'from every limit, 0 = at one or failing). Ties: lower price at the build quantity, then lifecycle.';

/** Checks that only inform (estimates without a rating to hold) do not weigh in the score. */
const INFORMATIVE = new Set(['surge-current', 'drain-spike', 'polarity', 'paired-switch', 'power-on', 'channel']);

export function scoreOf(checks: readonly Check[], verdict: Verdict = verdictOf(checks)): number {
  if (verdict === 'fail') return 0;
  // The smallest margin among the rated checks (1 when none is rated); a plain loop, as it runs per candidate.
  let smallest = Infinity;
  for (const c of checks) {
    if (INFORMATIVE.has(c.id) || c.limit == null || c.margin == null || !Number.isFinite(c.margin)) continue;
    if (c.margin < smallest) smallest = c.margin;
  }
  if (smallest === Infinity) smallest = 1;
  return Math.round(Math.min(100, Math.max(0, 100 * smallest)) * 10) / 10;
}

/** The default-locale comparison of String.prototype.localeCompare, built once (the same order, far cheaper per call). */
const byMpn = new Intl.Collator().compare;

/** Part numbers of digits, capital letters and hyphens only: most catalogues' (and the generated ones'). */
const PLAIN_MPN = /^[0-9A-Z-]*$/;

/**
 * True when the default collation orders plain part numbers as their code units do. The root and English
 * collations rank the hyphen before the digits and the digits before the letters at the first level, and
 * plain part numbers differ at no other level; other languages move letters (or pairs of them), so the fast
 * order is used only under an English or root locale and after this self-check.
 */
const plainOrderIsCodeUnit = ((): boolean => {
  if (!/^(en|und)(-|$)/.test(new Intl.Collator().resolvedOptions().locale)) return false;
  const alphabet = '-0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZ';
  for (let i = 1; i < alphabet.length; i++) if (byMpn(alphabet[i - 1], alphabet[i]) >= 0) return false;
  return byMpn('A-B', 'AB') < 0 && byMpn('AB', 'A-') > 0 && byMpn('A', 'A0') < 0 && byMpn('CH', 'HA') < 0;
})();

const byCodeUnit = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

/**
 * The comparison of part numbers for a list: the collator's order always; when every part number in the
 * list is plain (and the locale allows, see above), by code unit, which gives that order several times
 * faster (a match sorts tens of thousands of ties on MPN).
 */
export function mpnComparerFor(results: readonly { mpn: string }[]): (a: string, b: string) => number {
  return plainOrderIsCodeUnit && results.every((r) => PLAIN_MPN.test(r.mpn)) ? byCodeUnit : byMpn;
}

export function sortCandidates<T extends CandidateResult>(results: T[], tiebreak?: (a: T, b: T) => number): T[] {
  const byPartNumber = mpnComparerFor(results);
  return [...results].sort(
    (a, b) =>
      VERDICT_RANK[a.verdict] - VERDICT_RANK[b.verdict] || b.score - a.score || (tiebreak?.(a, b) ?? 0) || byPartNumber(a.mpn, b.mpn),
  );
}

/** sortCandidates(results)[0] (no tie-breaker) in one pass: the first of equal bests, as the stable sort keeps it. */
export function bestCandidate<T extends CandidateResult>(results: readonly T[]): T | undefined {
  const byPartNumber = mpnComparerFor(results);
  let best: T | undefined;
  for (const r of results) {
    if (!best || (VERDICT_RANK[r.verdict] - VERDICT_RANK[best.verdict] || best.score - r.score || byPartNumber(r.mpn, best.mpn)) < 0)
      best = r;
  }
  return best;
}

/** The switch input of a part's params, worked out once per params object (a match judges each part at up to two drives). */
const switchInputOfParams = memoOnObject((p: CandidatePart<'mosfet'>['params']) => switchInputOf(p));

export function switchInputFromPart(part: CandidatePart<'mosfet'>): SwitchMosfetInput {
  return switchInputOfParams(part.params);
}

function switchInputOf(p: CandidatePart<'mosfet'>['params']): SwitchMosfetInput {
  return {
    vdsMaxV: p.vdsMaxV,
    vgsMaxV: p.vgsMaxV,
    vgsThMaxV: p.vgsThMaxV,
    idPulsedA: p.idPulsedA,
    tjMaxC: p.tjMaxC,
    rthJaCPerW: p.rthJaCPerW,
    qgTotalNc: p.qgTotalNc,
    qgdNc: p.qgdNc,
    qgsNc: p.qgsNc,
    vPlateauV: p.vPlateauV,
    rdsOn: rdsOnPointsAt25C(p.rdsOn),
    channel: p.channel,
    zthPoints: p.zthPoints,
  };
}

/** The controller pin as a gate drive: its lowest high level and its current, less what a gate pull-down draws. */
export function pinGateDrive(c: DesignCase, wc: WorstCase, pullDownDrawA = 0): GateDrive {
  return {
    voltageV: wc.gateDriveMinV,
    maxVoltageV: wc.gateDriveMaxV,
    sourceCurrentA: Math.max(1e-6, c.logic.pinSourceCurrentA - pullDownDrawA),
    sinkCurrentA: c.logic.pinSinkCurrentA,
    driverPartId: null,
    driverMpn: null,
  };
}

/** The switch's operating values for this case at a given gate drive (the pin's, or a real driver's). */
export function switchOperatingFor(c: DesignCase, wc: WorstCase, drive: GateDrive): SwitchOperatingInput {
  return {
    supplyMaxV: wc.supplyMaxV,
    runningCurrentA: wc.runningCurrentA,
    stallCurrentA: wc.stallCurrentMaxA,
    gateDriveV: drive.voltageV,
    gateDriveMaxV: drive.maxVoltageV ?? drive.voltageV,
    gateDriveCurrentA: drive.sourceCurrentA,
    gateDriveSinkCurrentA: drive.sinkCurrentA,
    gateResistanceOhm: c.gateResistanceOhm ?? 0,
    ...(wc.pwmHz != null ? { pwmHz: wc.pwmHz, duty: wc.switchDuty } : {}),
    ambientC: wc.ambientMaxC,
    diodeForwardV: wc.diodeForwardV,
    currentRmsA: wc.switchRmsA,
    turnOnCurrentA: wc.turnOnCurrentA,
    turnOffCurrentA: wc.turnOffCurrentA,
    stallProtection: wc.stall.protection,
    stallDuty: wc.stall.duty,
    stallCurrentRmsA: wc.stall.currentRmsA,
  };
}

/** Evaluates one MOSFET part for the case at a gate drive; P-channel parts get a failing 'channel' check (low-side design). */
export function evaluateSwitchPart(
  c: DesignCase,
  part: CandidatePart<'mosfet'>,
  drive: GateDrive,
  wc: WorstCase = worstCaseOf(c),
): SwitchCandidateResult {
  return switchEvaluator(c, drive, wc)(part);
}

/**
 * How a ranking keeps a candidate's result: `full` with every check and its note; `lean` (a candidate the
 * match only counts) with the verdict, score and evaluation as in full, but only the checks that fail,
 * their notes empty. Judging a lean entry again in full gives the same verdict, score and failing checks.
 */
export type Keep = 'full' | 'lean';

/** The failing checks, for a lean entry (verdict, score and the failure counts read only these). */
export const failingOnly = (checks: Check[]): Check[] => checks.filter((x) => !x.ok);

/** `judge` for many parts as `keep` says: in lean, without notes and with only the failing checks kept. */
export function judgeAs<P, T extends { checks: Check[] }>(keep: Keep, judge: (part: P) => T): (part: P) => T {
  if (keep === 'full') return judge;
  return (part: P): T => {
    const result = withoutNotes(judge, part);
    result.checks = failingOnly(result.checks);
    return result;
  };
}

/** evaluateSwitchPart for many parts at one drive: the design's operating values and margins worked out once. */
export function switchEvaluator(c: DesignCase, drive: GateDrive, wc: WorstCase = worstCaseOf(c), keep: Keep = 'full') {
  const margins = marginsOf(c);
  const operating = switchOperatingFor(c, wc, drive);
  const shown: SwitchCandidateResult['drive'] = {
    gateV: drive.voltageV,
    sourceCurrentA: drive.sourceCurrentA,
    sinkCurrentA: drive.sinkCurrentA,
    by: drive.driverPartId != null ? 'driver' : 'pin',
    driverPartId: drive.driverPartId ?? null,
    driverMpn: drive.driverMpn ?? null,
  };
  return judgeAs(keep, (part: CandidatePart<'mosfet'>) => judgeSwitch(part, keep === 'full' ? { ...shown } : shown, operating, margins));
}

function judgeSwitch(
  part: CandidatePart<'mosfet'>,
  drive: SwitchCandidateResult['drive'],
  operating: SwitchOperatingInput,
  margins: ReturnType<typeof marginsOf>,
): SwitchCandidateResult {
  const result = evaluateSwitch({ mosfet: switchInputFromPart(part), operating, margins });
  return {
    partId: part.id ?? null,
    mpn: part.mpn,
    manufacturer: part.manufacturer,
    verdict: result.verdict,
    score: scoreOf(result.checks, result.verdict),
    checks: result.checks,
    evaluation: {
      rdsOnAtDriveOhms: result.rdsOnAtDriveOhms,
      junctionC: result.junctionC,
      conductionLossW: result.conductionLossW,
      switchingLossW: result.switchingLossW,
      gateDrivePowerW: result.gateDrivePowerW,
      stallJunctionC: result.stallJunctionC,
      stallCurrentRmsA: result.stallCurrentRmsA,
    },
    drive,
  };
}

/** Switches ranked at one gate drive for all (the controller pin unless a driver's drive is given). */
export function rankSwitchCandidates(
  c: DesignCase,
  mosfets: CandidatePart<'mosfet'>[],
  drive?: GateDrive,
  wc: WorstCase = worstCaseOf(c),
): SwitchCandidateResult[] {
  return sortCandidates(mosfets.map(switchEvaluator(c, drive ?? pinGateDrive(c, wc), wc)));
}

/** The diode inputs of a case that are the same for every part (worked out once per list). */
function diodeCaseOf(c: DesignCase, wc: WorstCase) {
  return {
    supplyMaxV: wc.supplyMaxV,
    meanCurrentA: wc.diodeMeanCurrentA,
    // Under PWM the turn-off current recurs every cycle; for on/off it is the one-off current after a jam.
    peakCurrentA: wc.diodeRepetitivePeakA ?? wc.stall.currentA,
    stallMeanCurrentA: wc.stall.diodeMeanA,
    ambientC: wc.ambientMaxC,
    pwmHz: wc.pwmHz,
    voltageDerating: marginsOf(c).voltageDerating,
    motorInductanceH: c.motor.inductanceH,
    motorResistanceOhm: c.motor.terminalResistanceOhm ?? c.motor.ratedVoltageV / c.motor.stallCurrentA,
  };
}

function judgeDiode(part: CandidatePart<'diode'>, diodeCase: ReturnType<typeof diodeCaseOf>): DiodeCandidateResult {
  const checks = checkDiode({ diode: part.params, ...diodeCase });
  const verdict = verdictOf(checks);
  const { kind, vrrmV, ifAvA, vfV, trrNs } = part.params;
  return {
    partId: part.id ?? null,
    mpn: part.mpn,
    manufacturer: part.manufacturer,
    verdict,
    score: scoreOf(checks, verdict),
    checks,
    diode: { kind, vrrmV, ifAvA, vfV, trrNs },
  };
}

/** evaluateDiodePart for many parts: the case's diode inputs worked out once. */
export function diodeEvaluator(c: DesignCase, wc: WorstCase = worstCaseOf(c), keep: Keep = 'full') {
  const diodeCase = diodeCaseOf(c, wc);
  return judgeAs(keep, (part: CandidatePart<'diode'>) => judgeDiode(part, diodeCase));
}

export function evaluateDiodePart(c: DesignCase, part: CandidatePart<'diode'>, wc: WorstCase): DiodeCandidateResult {
  return diodeEvaluator(c, wc)(part);
}

export function rankDiodeCandidates(
  c: DesignCase,
  diodes: CandidatePart<'diode'>[],
  wc: WorstCase = worstCaseOf(c),
  keep: Keep = 'full',
): DiodeCandidateResult[] {
  return sortCandidates(diodes.map(diodeEvaluator(c, wc, keep)));
}
