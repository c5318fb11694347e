/**
 * The one readiness rule: may this design go on the buyers' shortlist, judged by a match at the current
 * catalogue? Pure: the services pass the design input, a fresh match and what they know of the picked parts.
 *
 * A design holds when every role it needs has a chosen part; every chosen part and every alternate is among
 * the match's candidates (approved and not obsolete: the match's SQL leaves the others out) with verdict
 * pass, or marginal where every failing check is only a margin; each is approved (a match run with pending
 * parts shows them, but a pending part is refused here); a driver is chosen when the match uses one; the
 * supply report, when there is one, is not a fail; and the power-on walk of the chosen parts (with the
 * recommended pull fitted, since it goes on the bill of materials) leaves the motor off, unless the designer
 * recorded that a start at reset is intended.
 */
import type { Check, Verdict } from './checks.ts';
import type { DesignInput, PartRole } from './domain/design.ts';
import type { Lifecycle, ReviewStatus } from './domain/parts.ts';
import { effectiveSwitchList, type DesignMatch, type MatchEntry } from './design-match.ts';
import { checkLabelInline, checkLabelList } from './design-words.ts';
import type { MotorState, PowerOnResult } from './power-on.ts';

/** Same shape as the API's issues ({path, message}), so a refusal can carry them as they are. */
export interface ReadinessIssue {
  path: string;
  message: string;
}

/** What the caller knows of a picked part from the catalogue (to say why it is not a candidate). */
export interface PartFacts {
  mpn: string;
  lifecycle: Lifecycle;
  reviewStatus: ReviewStatus;
}

export interface ReadinessContext {
  /** Catalogue facts of the picked parts by id (optional: only sharpens the messages). */
  parts?: ReadonlyMap<number, PartFacts>;
  /** The catalogue motor, when the design uses one. */
  motor?: PartFacts | null;
}

type Entry = MatchEntry;

const ROLE_NAMES: Readonly<Record<PartRole, string>> = { switch: 'switch', driver: 'gate driver', diode: 'freewheel diode' };

/** The candidate list a role is judged from: the switch list the design really uses. */
export function roleList(match: DesignMatch, role: PartRole): readonly Entry[] {
  if (role === 'switch') return effectiveSwitchList(match);
  return role === 'driver' ? match.driver : match.diode;
}

/** Failing checks that break a rating (anything not explicitly a margin counts as hard, as in verdictOf). */
export const hardFails = (checks: readonly Check[]): Check[] => checks.filter((c) => !c.ok && c.severity !== 'margin');

/** A review status other than approved, in words a buyer reads plainly. */
export function reviewWords(status: ReviewStatus): string {
  if (status === 'approved') return 'approved';
  const what: Record<Exclude<ReviewStatus, 'approved'>, string> = {
    pending: 'pending review',
    draft: 'a draft, not reviewed',
    rejected: 'rejected in review',
  };
  return `${what[status]} — not approved`;
}

const checkList = (checks: readonly Check[]): string => checks.map((c) => `${checkLabelInline(c.id)}: ${c.note}`).join('; ');

/** Why a picked part is not among the candidates, from what the catalogue says of it. */
function notCandidateReason(facts: PartFacts | undefined): string {
  if (!facts) return 'it is no longer in the catalogue';
  if (facts.lifecycle === 'obsolete') return 'it is obsolete';
  if (facts.reviewStatus !== 'approved') return `its catalogue review is ${facts.reviewStatus}, not approved`;
  return 'a rating of it can never pass at these inputs';
}

/** The problem with one pick, or null when it holds. */
export function pickProblem(entry: Entry | undefined, partId: number, facts?: PartFacts): string | null {
  const name = entry?.mpn ?? facts?.mpn ?? `part ${partId}`;
  if (!entry) return `${name} is not among the current candidates: ${notCandidateReason(facts)}`;
  const hard = hardFails(entry.checks);
  if (entry.verdict === 'fail' || hard.length > 0) {
    return hard.length ? `${name} fails ${checkList(hard)}` : `${name} fails in this design`;
  }
  if (entry.lifecycle === 'obsolete') return `${name} is obsolete`;
  if (entry.reviewStatus !== 'approved') return `${name} is ${reviewWords(entry.reviewStatus)}`;
  return null;
}

function roleIssues(input: DesignInput, match: DesignMatch, role: PartRole, ctx: ReadinessContext): ReadinessIssue[] {
  const sel = input.selections[role];
  const list = roleList(match, role);
  const find = (id: number) => list.find((e) => e.partId === id);
  const issues: ReadinessIssue[] = [];
  const usesDriver = match.driverNeeded;
  if (sel.chosenPartId == null) {
    if (role !== 'driver' || usesDriver)
      issues.push({ path: `selections.${role}.chosenPartId`, message: `choose a ${ROLE_NAMES[role]} first` });
  }
  const picks = [
    ...(sel.chosenPartId != null ? [{ path: `selections.${role}.chosenPartId`, id: sel.chosenPartId }] : []),
    ...sel.alternatePartIds.map((id, i) => ({ path: `selections.${role}.alternatePartIds.${i}`, id })),
  ];
  for (const pick of picks) {
    const facts = ctx.parts?.get(pick.id);
    if (role === 'driver' && !usesDriver && list.length === 0) {
      // Direct drive: no driver was judged, so one on the BOM would be a pick nobody checked.
      issues.push({
        path: pick.path,
        message: `${facts?.mpn ?? `part ${pick.id}`} is not judged in this design (the switch is driven straight from the logic pin): take it out`,
      });
      continue;
    }
    const problem = pickProblem(find(pick.id), pick.id, facts);
    if (problem) issues.push({ path: pick.path, message: problem });
  }
  return issues;
}

/**
 * The motor's state at reset with the parts as built: with the recommended pull fitted when one is
 * recommended and a standard value fits (it goes on the BOM). Null when no walk was possible.
 */
export function motorStateAtReset(powerOn: PowerOnResult | null): MotorState | null {
  if (powerOn == null) return null;
  const p = powerOn;
  const pull = p.recommendedPull;
  const fitted = pull != null && pull.ok && pull.chosenOhms != null;
  if (fitted && p.withRecommendedPull) return p.withRecommendedPull.motorState;
  if (!p.motorCanStart) return 'off';
  const motorStep = p.steps.find((s) => s.stage === 'motor');
  return motorStep?.state === 'on' ? 'on' : 'may-run';
}

/** The recorded reason when the motor may run at reset and the designer said that is intended; else null. */
export function acceptedResetStart(input: DesignInput, match: DesignMatch): string | null {
  const state = motorStateAtReset(match.powerOn);
  return state != null && state !== 'off' && input.resetStartIntent ? input.resetStartIntent.reason : null;
}

function powerOnIssues(input: DesignInput, match: DesignMatch): ReadinessIssue[] {
  const state = motorStateAtReset(match.powerOn);
  if (state == null || state === 'off' || input.resetStartIntent) return [];
  const what = state === 'on' ? 'starts' : 'may start';
  return [
    {
      path: 'resetStartIntent',
      message: `the motor ${what} at power-up or reset (${match.powerOn?.note ?? 'see the power-on walk'}): change the reset state or the pull, or record why a start at reset is intended`,
    },
  ];
}

function supplyIssues(match: DesignMatch): ReadinessIssue[] {
  const supply = match.supply;
  if (supply == null || supply.verdict !== 'fail') return [];
  const hard = hardFails(supply.checks);
  return [{ path: 'supply', message: hard.length ? `the supply fails ${checkList(hard)}` : 'the supply fails for this motor' }];
}

function motorIssues(motor: PartFacts | null | undefined): ReadinessIssue[] {
  if (!motor) return [];
  if (motor.lifecycle === 'obsolete') return [{ path: 'motor.partId', message: `the motor ${motor.mpn} is obsolete` }];
  if (motor.reviewStatus !== 'approved')
    return [{ path: 'motor.partId', message: `the motor ${motor.mpn} is ${reviewWords(motor.reviewStatus)}` }];
  return [];
}

/** Every reason the design may not be (or stay) ready; empty when it holds. */
export function readinessIssues(input: DesignInput, match: DesignMatch, ctx: ReadinessContext = {}): ReadinessIssue[] {
  return [
    ...motorIssues(ctx.motor),
    ...(['switch', 'driver', 'diode'] as const).flatMap((role) => roleIssues(input, match, role, ctx)),
    ...supplyIssues(match),
    ...powerOnIssues(input, match),
  ];
}

export interface PickStatus {
  verdict: Verdict | null;
  reviewStatus: ReviewStatus | null;
  holds: boolean;
  /** Verdict and review status in words with the verdict mark, for a BOM or shortlist cell. */
  text: string;
}

const MARK: Readonly<Record<Verdict, string>> = { pass: '✓ pass', marginal: '! marginal', fail: '✕ fail' };

/** One pick at the current catalogue, as a BOM line or shortlist line shows it. */
export function pickStatus(match: DesignMatch, role: PartRole, partId: number, facts?: PartFacts): PickStatus {
  const list = roleList(match, role);
  const entry = list.find((e) => e.partId === partId);
  const problem =
    role === 'driver' && !match.driverNeeded && list.length === 0 ? 'not judged (direct drive)' : pickProblem(entry, partId, facts);
  if (!entry) return { verdict: null, reviewStatus: facts?.reviewStatus ?? null, holds: false, text: `✕ ${problem ?? 'not a candidate'}` };
  const review = reviewWords(entry.reviewStatus);
  const failing = hardFails(entry.checks).map((c) => c.id);
  const margins = entry.checks.filter((c) => !c.ok && c.severity === 'margin').map((c) => c.id);
  const detail = failing.length ? ` (${checkLabelList(failing)})` : margins.length ? ` (margin: ${checkLabelList(margins)})` : '';
  return {
    verdict: entry.verdict,
    reviewStatus: entry.reviewStatus,
    holds: problem == null,
    text: `${MARK[entry.verdict]}${detail} · ${review}`,
  };
}
