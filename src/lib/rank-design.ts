/**
 * The whole design: diode first (its VF feeds the currents), switch (direct drive, or at a real driver's output),
 * driver for the chosen switch, power-on walk and cautions [docs/engineering.md §5–§9].
 * Every list is judged at the drive the design really has: the controller pin, or the chosen driver (before one
 * is chosen, the best real catalogue driver) — never an ideal one.
 */
import { fmt, type Check } from './checks.ts';
import { avalancheEnergyJ, avalanchePowerW } from './diode-checks.ts';
import type { CandidatePart } from './domain/parts.ts';
import {
  describeDriverNeed,
  driverSupplyOf,
  gateDriveOfDriver,
  powerOnForPair,
  provisionalDriver,
  evaluateDriverPart,
  judgeDriverFor,
  type DriverCandidateResult,
} from './driver-ranking.ts';
import { DEFAULT_DIODE_FORWARD_V, motorConsistencyOf, motorModelOf, worstCaseOf, type DesignCase, type WorstCase } from './design-case.ts';
import { suggestedDriveRailV } from './mosfet-checks.ts';
import type { PowerOnResult } from './power-on.ts';
import { pullDrawCurrentA } from './power-on-advice.ts';
import {
  bestCandidate,
  switchEvaluator,
  pinGateDrive,
  diodeEvaluator,
  sortCandidates,
  type Keep,
  type CandidateResult,
  type DiodeCandidateResult,
  type GateDrive,
  type SwitchCandidateResult,
} from './ranking.ts';
import { lowestSpecVgsV, rdsOnPointsAt25C } from './rdson.ts';
import { pwmFrequencyCaution } from './ripple.ts';
import { formatSi } from './units.ts';
import { CAUTIONS } from './safety-notes.ts';
import { mapInSlices, runSteps, SLICE_PARTS, type Steps } from './slices.ts';

/** The drive the switch list was judged at. */
export interface SwitchDrive {
  by: 'pin' | 'driver';
  gateV: number;
  sourceCurrentA: number;
  driverPartId: number | null;
  driverMpn: string | null;
  /** True while no driver is chosen: the list is judged at the best real driver in the catalogue. */
  provisional: boolean;
  /** Current a recommended gate pull-down draws from the pin while it drives high (already subtracted). */
  pullDownDrawA: number;
}

export interface DesignRanking {
  worstCase: WorstCase;
  /** Switches driven straight from the logic pin. */
  switch: SwitchCandidateResult[];
  /** The design uses a driver: it is needed (a driver fixes the failures) or the designer chose one. */
  driverNeeded: boolean;
  driverNeededNote: string | null;
  /** Lowest RDS(on) spec VGS of the switch the design settles on. */
  requiredGateDriveV: number | null;
  /** Switches judged at the chosen (or best real) driver's output; filled when a driver is used. */
  switchWithDriver: SwitchCandidateResult[];
  /** What the effective switch list was judged at. */
  switchDrive: SwitchDrive;
  driver: DriverCandidateResult[];
  diode: DiodeCandidateResult[];
  /** Which diode's VF the currents use. */
  diodeForward: { voltageV: number; basis: 'chosen' | 'lowest-passing' | 'default' };
  powerOn: PowerOnResult | null;
  /** Every caution for the design (the report prints them all). */
  cautions: string[];
  /**
   * The cautions the workspace lists at its foot: those not already printed beside their own step (the
   * power-on note and the unexpected start with step 7 when the motor can start, the start-up current and
   * stall heat with the motor and the supply, the PWM frequency and the datasheet check with the motor, the
   * inductive spike with the diode), so each shows once.
   */
  otherCautions: string[];
}

/** The candidates ranked: full parts or the lighter rows the match loads (CandidatePart). */
export interface DesignCatalogue {
  mosfets: CandidatePart<'mosfet'>[];
  drivers: CandidatePart<'driver'>[];
  diodes: CandidatePart<'diode'>[];
}

/** The designer's picks, when made (ids of catalogue parts). */
export interface DesignPicks {
  switchId?: number | null;
  driverId?: number | null;
  diodeId?: number | null;
  /** The designer recorded that the motor running at reset is intended. */
  resetStartIntended?: boolean;
}

/** Safety cautions shown with every result (src/lib/safety-notes.ts, docs/engineering.md §11). */
export const STANDING_CAUTIONS: readonly string[] = CAUTIONS.map((c) => `${c.title}: ${c.text}`);

/** Failures a gate driver can fix: too little gate voltage or current [docs/engineering.md §7.1]. */
export const DRIVER_FIXABLE = new Set(['gate-drive', 'miller-plateau', 'switching-edges', 'rdson-test-current']);

const hardFails = (checks: readonly Check[]): Check[] => checks.filter((x) => !x.ok && x.severity !== 'margin');

function byId<T extends { id?: number }>(parts: T[], id: number | null | undefined): T | undefined {
  return id == null ? undefined : parts.find((p) => p.id === id);
}

/** The chosen diode's VF, else the lowest VF among passing diodes, else the conservative default. */
/** Also hands back the diode ranking at `c` when it was worked out (it is the list when VF leaves the case as it is). */
function* diodeForwardFor(
  c: DesignCase,
  catalogue: DesignCatalogue,
  picks: DesignPicks,
  wc0: WorstCase,
  keep: Keep,
  slice: number,
): Steps<{ forward: DesignRanking['diodeForward']; rankedAtC: DiodeCandidateResult[] | null }> {
  const chosen = byId(catalogue.diodes, picks.diodeId);
  if (chosen) return { forward: { voltageV: chosen.params.vfV, basis: 'chosen' }, rankedAtC: null };
  const ranked = yield* rankDiodesSliced(c, catalogue.diodes, wc0, keep, slice);
  const vfById = new Map(catalogue.diodes.map((d) => [d.id, d.params.vfV]));
  const vfs = ranked
    .filter((d) => d.verdict !== 'fail')
    .map((d) => (d.partId == null ? undefined : vfById.get(d.partId)))
    .filter((v): v is number => v != null);
  const forward: DesignRanking['diodeForward'] =
    vfs.length > 0
      ? { voltageV: Math.min(...vfs), basis: 'lowest-passing' }
      : { voltageV: c.diodeForwardV ?? DEFAULT_DIODE_FORWARD_V, basis: 'default' };
  return { forward, rankedAtC: ranked };
}

/** Diodes ranked as rankDiodeCandidates ranks them, in slices. */
function* rankDiodesSliced(
  c: DesignCase,
  diodes: CandidatePart<'diode'>[],
  wc: WorstCase,
  keep: Keep,
  slice: number,
): Steps<DiodeCandidateResult[]> {
  const judged = yield* mapInSlices(diodes, diodeEvaluator(c, wc, keep), slice);
  yield;
  return sortCandidates(judged);
}

/** Switches judged at one drive and sorted, in slices (a pause before the sort too). */
function* rankSwitchesSliced(
  c: DesignCase,
  mosfets: CandidatePart<'mosfet'>[],
  drive: GateDrive,
  wc: WorstCase,
  keep: Keep,
  slice: number,
): Steps<SwitchCandidateResult[]> {
  const judged = yield* mapInSlices(mosfets, switchEvaluator(c, drive, wc, keep), slice);
  yield;
  return sortCandidates(judged);
}

/** Direct drive: the pin, less what a recommended gate pull-down draws while the pin drives high. */
function* directDrive(
  c: DesignCase,
  wc: WorstCase,
  catalogue: DesignCatalogue,
  picks: DesignPicks,
  keep: Keep,
  slice: number,
): Steps<{ drive: GateDrive; list: SwitchCandidateResult[]; draw: number }> {
  // The reference part for the pull-down advice: the chosen switch, else the best at the bare pin (only
  // then is the list at the bare pin needed before the draw is known).
  const chosen = byId(catalogue.mosfets, picks.switchId);
  const bare = chosen ? null : yield* mapInSlices(catalogue.mosfets, switchEvaluator(c, pinGateDrive(c, wc), wc, keep), slice);
  const reference = chosen ?? byId(catalogue.mosfets, bestCandidate(bare ?? [])?.partId);
  const pull = reference ? powerOnForPair(c, null, reference).recommendedPull : null;
  // The same worst case as the power-on advice reports: the pin at its rail, the resistor at −tol.
  const draw = pullDrawCurrentA(pull, c.logic.railV);
  if (draw === 0) {
    if (!bare)
      return {
        drive: pinGateDrive(c, wc),
        list: yield* rankSwitchesSliced(c, catalogue.mosfets, pinGateDrive(c, wc), wc, keep, slice),
        draw,
      };
    yield;
    return { drive: pinGateDrive(c, wc), list: sortCandidates(bare), draw };
  }
  const drive = pinGateDrive(c, wc, draw);
  return { drive, list: yield* rankSwitchesSliced(c, catalogue.mosfets, drive, wc, keep, slice), draw };
}

function failureSummary(list: SwitchCandidateResult[]): string {
  const counts = new Map<string, number>();
  for (const e of list) for (const x of hardFails(e.checks)) counts.set(x.id, (counts.get(x.id) ?? 0) + 1);
  return [...counts.entries()]
    .sort((a, b) => b[1] - a[1])
    .slice(0, 4)
    .map(([id, n]) => `${id} (${n})`)
    .join(', ');
}

function driverNote(
  c: DesignCase,
  catalogue: DesignCatalogue,
  direct: SwitchCandidateResult[],
  needed: boolean,
  fixable: SwitchCandidateResult | undefined,
): string | null {
  if (direct.some((e) => e.verdict === 'pass')) return null;
  if (!needed) {
    return direct.length === 0
      ? 'No MOSFET in the catalogue can carry this design’s ratings.'
      : `No switch holds, and a gate driver would not fix it: the failing checks are ${failureSummary(direct)}. These need another part (higher ratings, lower RDS(on) or RθJA), not more gate drive.`;
  }
  const part = byId(catalogue.mosfets, fixable?.partId);
  const requiredV = part ? lowestSpecVgsV(rdsOnPointsAt25C(part.params.rdsOn)) : null;
  if (!part || requiredV == null) return 'No switch passes with direct drive; a gate driver is needed.';
  return describeDriverNeed(c.logic.highV, part.mpn, requiredV, suggestedDriveRailV(requiredV, part.params.vgsMaxV));
}

interface DesignCaution {
  text: string;
  /** True when the workspace prints it beside its own step. */
  inPlace: boolean;
}

function dynamicCautions(c: DesignCase, wc: WorstCase, diode: CandidateResult[]): DesignCaution[] {
  const cautions: DesignCaution[] = [];
  const push = (text: string, inPlace = false) => cautions.push({ text, inPlace });
  const consistency = motorConsistencyOf(c);
  if (consistency.warning) push(consistency.warning, true);
  push(
    `Worst-case start-up current is ${fmt(wc.stallCurrentMaxA)} A (stall at ${fmt(wc.supplyMaxV)} V with the winding at ${fmt(wc.windingColdC)} °C): fuse and wiring must carry it.`,
    true,
  );
  if ((c.stallProtection?.kind ?? 'none') === 'none') {
    push(
      'No stall protection is set: a jammed shaft holds the switch on at stall current until someone ' +
        'notices. Switch, diode and motor case can exceed 100 °C; consider a current limit or a timed cut-off.',
    );
  }
  push('Junction temperatures use the datasheet RθJA from its test board; your board may run hotter or cooler.');
  if (wc.pwmHz != null && c.motor.inductanceH != null) {
    const tauS = c.motor.inductanceH / motorModelOf(c).resistanceOhm;
    const caution = pwmFrequencyCaution(wc.pwmHz, tauS);
    if (caution) push(caution, true);
  }
  const diodeOk = diode.some((d) => d.verdict !== 'fail');
  if (!diodeOk && c.motor.inductanceH != null) {
    const energyJ = avalancheEnergyJ(c.motor.inductanceH, wc.stallCurrentMaxA);
    const perCycle =
      wc.pwmHz != null
        ? `, ${fmt(avalanchePowerW(c.motor.inductanceH, wc.stallCurrentMaxA, wc.pwmHz))} W at ${formatSi(wc.pwmHz, 'Hz', 3)}`
        : '';
    push(
      `No suitable freewheel diode: without one, ½·L·I² = ${fmt(energyJ * 1000)} mJ avalanches the switch at every turn-off${perCycle}.`,
    );
  }
  return cautions;
}

/** The standing cautions the workspace prints beside a step: stall heat (motor), inductive spike (diode). */
const STANDING_IN_PLACE: ReadonlySet<string> = new Set(['stall-heat', 'inductive-spike']);

function designCautions(powerOn: PowerOnResult | null, dynamic: DesignCaution[]): Pick<DesignRanking, 'cautions' | 'otherCautions'> {
  const canStart = powerOn?.motorCanStart === true;
  const all: DesignCaution[] = [
    ...(canStart && powerOn ? [{ text: powerOn.note, inPlace: true }] : []),
    ...dynamic,
    ...CAUTIONS.map((x) => ({
      text: `${x.title}: ${x.text}`,
      inPlace: STANDING_IN_PLACE.has(x.id) || (x.id === 'unexpected-start' && canStart),
    })),
  ];
  return { cautions: all.map((x) => x.text), otherCautions: [...new Set(all.filter((x) => !x.inPlace).map((x) => x.text))] };
}

/** Power-on walk for a given switch and (optional) driver. */
export function powerOnFor(
  c: DesignCase,
  sw: CandidatePart<'mosfet'> | undefined,
  driver: CandidatePart<'driver'> | undefined,
): PowerOnResult | null {
  return sw == null ? null : powerOnForPair(c, driver ?? null, sw);
}

/**
 * How to judge one part of each list again in full, exactly as the ranking judged it (the same case,
 * worst case and drive): a lean ranking's page entries get their checks and notes from it.
 */
export interface RankingJudges {
  switch: (part: CandidatePart<'mosfet'>) => SwitchCandidateResult;
  switchWithDriver: (part: CandidatePart<'mosfet'>) => SwitchCandidateResult;
  driver: (part: CandidatePart<'driver'>) => DriverCandidateResult;
  diode: (part: CandidatePart<'diode'>) => DiodeCandidateResult;
}

/**
 * `wc0`: the worst case of `c0` when the caller already has it (the match computes it once for the SQL
 * narrowing and the ranking). It is worked out again only when the diode's VF changes the case.
 */
export function rankDesign(
  c0: DesignCase,
  catalogue: DesignCatalogue,
  picks: DesignPicks = {},
  wc0: WorstCase = worstCaseOf(c0),
): DesignRanking {
  return runSteps(rankSteps(c0, catalogue, picks, wc0, 'full', SLICE_PARTS)).ranking;
}

/**
 * rankDesign with every list entry kept lean (verdict, score and failing checks without notes; see Keep):
 * the same order, counts, failures, picks and suggestions, far less work and memory on a large catalogue;
 * `judges` gives any entry in full.
 */
export function rankDesignLean(
  c0: DesignCase,
  catalogue: DesignCatalogue,
  picks: DesignPicks = {},
  wc0: WorstCase = worstCaseOf(c0),
): { ranking: DesignRanking; judges: RankingJudges } {
  return runSteps(rankSteps(c0, catalogue, picks, wc0, 'lean', SLICE_PARTS));
}

/**
 * rankDesignLean in slices: the generator pauses after every `slice` parts judged and before each sort, so a
 * server can let other requests run, or stop the work, between slices (runSteps runs it straight through;
 * the answer is the same).
 */
export function rankDesignLeanSteps(
  c0: DesignCase,
  catalogue: DesignCatalogue,
  picks: DesignPicks = {},
  wc0: WorstCase = worstCaseOf(c0),
  slice: number = SLICE_PARTS,
  earlier?: EarlierDiodes,
): Steps<{ ranking: DesignRanking; judges: RankingJudges }> {
  return rankSteps(c0, catalogue, picks, wc0, 'lean', slice, earlier);
}

/**
 * A lean ranking made a moment before on another catalogue (the match's first drive phase), with the
 * diodes it ranked: when it was ranked for the same case (the same object) and diode pick, and its diodes
 * are the very same parts in the same order, its diode list and the diode VF it settled on are the ones
 * this ranking would work out again. What it was ranked for is recorded by rankSteps (rankedFor), not
 * taken from the caller.
 */
export interface EarlierDiodes {
  diodes: readonly CandidatePart<'diode'>[];
  ranking: DesignRanking;
}

/** The case and diode pick each lean ranking was made for (read back by a later phase's rankSteps). */
const rankedFor = new WeakMap<DesignRanking, { designCase: DesignCase; diodeId: number | null | undefined }>();

const sameParts = <P>(a: readonly P[], b: readonly P[]): boolean => a.length === b.length && a.every((p, i) => p === b[i]);

function* rankSteps(
  c0: DesignCase,
  catalogue: DesignCatalogue,
  picks: DesignPicks,
  wc0: WorstCase,
  keep: Keep,
  slice: number,
  earlier?: EarlierDiodes,
): Steps<{ ranking: DesignRanking; judges: RankingJudges }> {
  const earlierFor = earlier && rankedFor.get(earlier.ranking);
  const reuse =
    earlier &&
    keep === 'lean' &&
    earlierFor?.designCase === c0 &&
    earlierFor.diodeId === picks.diodeId &&
    sameParts(earlier.diodes, catalogue.diodes)
      ? earlier.ranking
      : null;
  const { forward: diodeForward, rankedAtC } = reuse
    ? { forward: reuse.diodeForward, rankedAtC: null }
    : yield* diodeForwardFor(c0, catalogue, picks, wc0, keep, slice);
  const c: DesignCase = diodeForward.voltageV === c0.diodeForwardV ? c0 : { ...c0, diodeForwardV: diodeForward.voltageV };
  const wc = c === c0 ? wc0 : worstCaseOf(c);
  const diode = reuse ? reuse.diode : c === c0 && rankedAtC ? rankedAtC : yield* rankDiodesSliced(c, catalogue.diodes, wc, keep, slice);
  const direct = yield* directDrive(c, wc, catalogue, picks, keep, slice);

  const chosenDriver = byId(catalogue.drivers, picks.driverId);
  const refDriver = chosenDriver ?? provisionalDriver(c, catalogue.drivers, wc);
  const directPasses = direct.list.some((e) => e.verdict === 'pass');
  const driverDrive = refDriver ? gateDriveOfDriver(c, refDriver) : null;
  const withDriver =
    driverDrive && (chosenDriver || !directPasses) ? yield* rankSwitchesSliced(c, catalogue.mosfets, driverDrive, wc, keep, slice) : [];
  const fixable =
    withDriver.find((e) => e.verdict === 'pass') ??
    direct.list.find((e) => hardFails(e.checks).length > 0 && hardFails(e.checks).every((x) => DRIVER_FIXABLE.has(x.id)));
  const driverHelps = !directPasses && fixable != null;
  const usesDriver = chosenDriver != null || driverHelps;

  const effective = usesDriver ? withDriver : direct.list;
  const switchPart = byId(catalogue.mosfets, picks.switchId) ?? byId(catalogue.mosfets, effective[0]?.partId);
  const startIntended = picks.resetStartIntended === true;
  const driver =
    usesDriver && switchPart
      ? sortCandidates(yield* mapInSlices(catalogue.drivers, judgeDriverFor(c, switchPart, wc, startIntended, keep), slice))
      : [];
  const walkDriver = usesDriver
    ? (chosenDriver ?? byId(catalogue.drivers, driver.find((d) => d.verdict !== 'fail')?.partId ?? driver[0]?.partId))
    : undefined;
  const powerOn = powerOnFor(c, switchPart, walkDriver);
  const drive = usesDriver && driverDrive ? driverDrive : direct.drive;
  const ranking: DesignRanking = {
    worstCase: wc,
    switch: direct.list,
    driverNeeded: usesDriver,
    driverNeededNote: driverNote(c, catalogue, direct.list, driverHelps, fixable),
    requiredGateDriveV: switchPart ? lowestSpecVgsV(rdsOnPointsAt25C(switchPart.params.rdsOn)) : null,
    switchWithDriver: usesDriver ? withDriver : [],
    switchDrive: {
      by: usesDriver && driverDrive ? 'driver' : 'pin',
      gateV: drive.voltageV,
      sourceCurrentA: drive.sourceCurrentA,
      driverPartId: drive.driverPartId ?? null,
      driverMpn: drive.driverMpn ?? null,
      provisional: usesDriver && chosenDriver == null,
      pullDownDrawA: usesDriver ? 0 : direct.draw,
    },
    driver,
    diode,
    diodeForward,
    powerOn,
    ...designCautions(powerOn, dynamicCautions(c, wc, diode)),
  };
  const noList = (): never => {
    throw new Error('this list is empty in the ranking: nothing to judge');
  };
  const judges: RankingJudges = {
    switch: switchEvaluator(c, direct.drive, wc),
    switchWithDriver: driverDrive ? switchEvaluator(c, driverDrive, wc) : noList,
    driver: switchPart ? (d) => evaluateDriverPart(c, d, switchPart, wc, startIntended) : noList,
    diode: diodeEvaluator(c, wc),
  };
  if (keep === 'lean') rankedFor.set(ranking, { designCase: c0, diodeId: picks.diodeId });
  return { ranking, judges };
}

export { driverSupplyOf };
