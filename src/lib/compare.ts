/**
 * Side-by-side comparison of up to four candidates for one line of a design, and the near-miss hints a
 * list with nothing passing shows. Both read the checks the design's match already produced: a part in
 * the ranked list keeps its entry as it is; a part the ranking never saw (left out before it ran:
 * obsolete, pending review, or a rating that can never pass) is judged here at the very drive, diode VF
 * and worst case the match settled on, through the same per-part evaluations the ranking calls. Pure.
 */
import type { Check, Verdict } from './checks.ts';
import type { DesignCase } from './design-case.ts';
import type { DesignMatch, PreparedCase } from './design-match.ts';
import { effectiveSwitchList } from './design-match.ts';
import { checkFigure, checkLabel } from './design-words.ts';
import type { Lifecycle, Part, ReviewStatus } from './domain/parts.ts';
import { gateDriveOfDriver, rankDriverCandidates } from './driver-ranking.ts';
import { bestUnitPrice } from './part-summary.ts';
import { evaluateDiodePart, evaluateSwitchPart, mpnComparerFor, pinGateDrive, type CandidateResult } from './ranking.ts';
import type { DesignCatalogue } from './rank-design.ts';

export const COMPARE_ROLES = ['switch', 'driver', 'diode'] as const;
export type CompareRole = (typeof COMPARE_ROLES)[number];
export const MAX_COMPARE_PARTS = 4;

/** The catalogue category a role's parts come from. */
export const ROLE_CATEGORY: Readonly<Record<CompareRole, 'mosfet' | 'driver' | 'diode'>> = {
  switch: 'mosfet',
  driver: 'driver',
  diode: 'diode',
};

/** Which way a limit binds: the value must stay at or below it, or reach at least it. */
export type LimitSense = 'at-most' | 'at-least';

export interface CompareCheck {
  id: string;
  label: string;
  verdict: Verdict;
  value: number | null;
  limit: number | null;
  unit: string;
  margin: number | null;
  /** The check's own sentence: why it holds or fails. */
  reason: string;
  sense: LimitSense | null;
}

export interface ComparePart {
  partId: number;
  mpn: string;
  manufacturer: string;
  package: string;
  lifecycle: Lifecycle;
  reviewStatus: ReviewStatus;
  verdict: Verdict;
  score: number;
  /** Place in the match's ranked list (1 = best); null when the ranking left the part out. */
  rank: number | null;
  /** Why the ranking left it out (then judged here at the same drive); null when ranked. */
  outsideRanking: string | null;
  priceAtQty: { qty: number; unitPrice: number; currency: string } | null;
  checks: CompareCheck[];
}

/** The verdict of one check: holds, inside the margin only, or breaks a limit. */
export function checkVerdict(c: Pick<Check, 'ok' | 'severity'>): Verdict {
  if (c.ok) return 'pass';
  return c.severity === 'margin' ? 'marginal' : 'fail';
}

/**
 * Which way the limit binds, read from the check's own margin (marginBelow = (limit − value)/|limit| for
 * an upper limit, marginAbove = (value − limit)/|limit| for a lower one); null when it cannot be told.
 */
export function limitSense(c: Pick<Check, 'value' | 'limit' | 'margin' | 'ok'>): LimitSense | null {
  if (c.value == null || c.limit == null || c.limit === 0) return null;
  const below = (c.limit - c.value) / Math.abs(c.limit);
  if (c.margin != null && Number.isFinite(c.margin) && c.value !== c.limit) {
    return Math.abs(c.margin - below) <= Math.abs(c.margin + below) ? 'at-most' : 'at-least';
  }
  if (c.value === c.limit) return null;
  // No margin: a failing check is on the wrong side of its limit, a holding one on the right side.
  return c.value > c.limit === !c.ok ? 'at-most' : 'at-least';
}

/** A check's number in the units people read: mA / ns / µs / mΩ through the shared formatter, duty as %. */
/** A check's value or limit as people read it: the shared check formatter (design-words `checkFigure`). */
export function checkQuantity(value: number | null, unit: string): string {
  return checkFigure(value, unit);
}

export function compareCheck(c: Check): CompareCheck {
  return {
    id: c.id,
    label: checkLabel(c.id),
    verdict: checkVerdict(c),
    value: c.value,
    limit: c.limit,
    unit: c.unit,
    margin: c.margin,
    reason: c.note,
    sense: limitSense(c),
  };
}

/** "needs ≤ 60 mΩ" / "needs ≥ 12 V" for a check with a limit; null without one. */
export function needsText(c: Pick<CompareCheck, 'id' | 'limit' | 'unit' | 'sense'>): string | null {
  if (c.limit == null || c.sense == null) return null;
  return `needs ${c.sense === 'at-most' ? '≤' : '≥'} ${checkQuantity(c.limit, c.unit)}`;
}

/** The list of a role the workspace shows (the switch list the design really uses). */
export function roleList(match: DesignMatch, role: CompareRole): DesignMatch['switch' | 'driver' | 'diode'] {
  return role === 'switch' ? effectiveSwitchList(match) : role === 'driver' ? match.driver : match.diode;
}

function diodeAdjusted(prepared: PreparedCase, match: DesignMatch): DesignCase {
  const c = prepared.designCase;
  return match.diodeForward.voltageV === c.diodeForwardV ? c : { ...c, diodeForwardV: match.diodeForward.voltageV };
}

/**
 * One part the ranking did not see, judged at the match's own settings: a switch at the drive the list
 * was judged at (the pin less its pull-down draw, or the reference driver), a diode at the same worst
 * case, a driver paired with the chosen switch (else the best one). Null for a driver with no switch.
 */
export function judgeOutside(
  role: CompareRole,
  part: Part,
  prepared: PreparedCase,
  catalogue: DesignCatalogue,
  match: DesignMatch,
  picks: { switchId: number | null; resetStartIntended: boolean },
): CandidateResult | null {
  const c = diodeAdjusted(prepared, match);
  const wc = match.worstCase;
  if (role === 'switch' && part.category === 'mosfet') {
    const sd = match.switchDrive;
    const refDriver = sd.by === 'driver' ? catalogue.drivers.find((d) => d.id === sd.driverPartId) : undefined;
    const drive = refDriver ? gateDriveOfDriver(c, refDriver) : pinGateDrive(c, wc, sd.pullDownDrawA);
    return evaluateSwitchPart(c, part, drive, wc);
  }
  if (role === 'diode' && part.category === 'diode') return evaluateDiodePart(c, part, wc);
  if (role === 'driver' && part.category === 'driver') {
    const effective = effectiveSwitchList(match);
    const byId = (id: number | null | undefined) => (id == null ? undefined : catalogue.mosfets.find((m) => m.id === id));
    const sw: DesignCatalogue['mosfets'][number] | undefined = byId(picks.switchId) ?? byId(effective[0]?.partId);
    if (!sw) return null;
    return rankDriverCandidates(c, [part], sw, wc, picks.resetStartIntended)[0] ?? null;
  }
  return null;
}

/** Why a part is not in the ranked list although it exists and the person may see it. */
export function outsideReason(part: Part, includePending: boolean): string {
  if (part.lifecycle === 'obsolete') return 'Obsolete: the ranking leaves it out of new designs; judged here at the same drive.';
  if (part.reviewStatus !== 'approved' && !(includePending && part.reviewStatus === 'pending'))
    return `${part.reviewStatus === 'pending' ? 'Pending review' : `Not approved (${part.reviewStatus})`}: the ranking leaves it out; judged here at the same drive.`;
  return 'Left out before ranking: a rating or its gate drive can never pass here; judged here at the same drive.';
}

/** One column of the comparison from a ranked entry or an outside judgement. */
export function comparePart(
  part: Part,
  result: CandidateResult,
  rank: number | null,
  outsideRanking: string | null,
  qty: number,
): ComparePart {
  const price = bestUnitPrice(part, qty);
  return {
    partId: part.id as number,
    mpn: part.mpn,
    manufacturer: part.manufacturer,
    package: part.package,
    lifecycle: part.lifecycle,
    reviewStatus: part.reviewStatus,
    verdict: result.verdict,
    score: result.score,
    rank,
    outsideRanking,
    priceAtQty: price ? { qty, unitPrice: price.price, currency: price.currency } : null,
    checks: result.checks.map(compareCheck),
  };
}

/** The rows of the table: every check any compared part carries, in the order they first appear. */
export function compareRows(parts: readonly Pick<ComparePart, 'checks'>[]): { id: string; label: string }[] {
  const seen = new Map<string, string>();
  for (const p of parts) for (const c of p.checks) if (!seen.has(c.id)) seen.set(c.id, c.label);
  return [...seen.entries()].map(([id, label]) => ({ id, label }));
}

const hardFail = (c: Check) => !c.ok && c.severity !== 'margin';

export interface NearMiss {
  partId: number | null;
  mpn: string;
  verdict: Verdict;
  /** The checks that do not hold, each as "label value, needs ≤ limit" (or the check's sentence without numbers). */
  misses: { id: string; label: string; text: string; shortfall: number | null }[];
  /** The largest relative distance to a limit among the misses (|value − limit| / |limit|). */
  worstShortfall: number;
}

/**
 * The closest candidates when nothing passes: marginal parts before failing ones, then the smallest worst
 * relative distance to a limit (a miss without numbers counts as far), then fewest checks missed, then
 * part number. A failing part lists
 * the limits it breaks; a marginal one the margins it eats into. Empty when something passes.
 */
export function nearMisses(list: readonly NearMissEntry[], count = 3, inFull: (e: NearMissEntry) => NearMissEntry = (e) => e): NearMiss[] {
  if (list.length === 0 || list.some((e) => e.verdict === 'pass')) return [];
  // Ranked on numbers alone; the words are worked out for the few shown (`inFull` gives an entry whose
  // checks carry their notes when the list holds lean entries).
  const missedOf = (e: NearMissEntry) => e.checks.filter((c) => (e.verdict === 'fail' ? hardFail(c) : !c.ok));
  const shortfallOf = (c: Check) =>
    c.value != null && c.limit != null && c.limit !== 0 ? Math.abs(c.value - c.limit) / Math.abs(c.limit) : null;
  const rank = (v: Verdict) => (v === 'marginal' ? 0 : 1);
  // The default collation of part numbers (by code unit where that is the same order: see mpnComparerFor).
  const byMpn = mpnComparerFor(list);
  type Keyed = { e: NearMissEntry; worst: number; misses: number };
  const before = (a: Keyed, b: Keyed) =>
    rank(a.e.verdict) - rank(b.e.verdict) || a.worst - b.worst || a.misses - b.misses || byMpn(a.e.mpn, b.e.mpn);
  // The first `count` in that order (a stable selection: equal keys keep the list's order, as a stable sort does).
  // One key object is reused for the entries that do not get in (a list holds tens of thousands).
  const best: Keyed[] = [];
  let k: Keyed = { e: list[0], worst: 0, misses: 0 };
  for (const e of list) {
    const fail = e.verdict === 'fail';
    let worst = 0;
    let misses = 0;
    for (const c of e.checks) {
      if (fail ? !hardFail(c) : c.ok) continue;
      misses++;
      // A miss without numbers (wrong channel, no RDS(on) at this drive) counts as far away.
      worst = Math.max(worst, shortfallOf(c) ?? Infinity);
    }
    k.e = e;
    k.worst = worst;
    k.misses = misses;
    let at = best.length;
    while (at > 0 && before(k, best[at - 1]) < 0) at--;
    if (at < count) {
      best.splice(at, 0, k);
      if (best.length > count) best.pop();
      k = { e, worst: 0, misses: 0 };
    }
  }
  return best.map(({ e, worst }) => {
    const full = inFull(e);
    const failing = missedOf(full).map((c) => {
      const cc = compareCheck(c);
      const needs = needsText(cc);
      const text = needs && c.value != null ? `${cc.label} ${checkQuantity(c.value, c.unit)}, ${needs}` : `${cc.label}: ${c.note}`;
      return { id: c.id, label: cc.label, text, shortfall: shortfallOf(c) };
    });
    return { partId: e.partId, mpn: e.mpn, verdict: e.verdict, misses: failing, worstShortfall: worst };
  });
}

/** What nearMisses reads of a list entry. */
export interface NearMissEntry {
  partId: number | null;
  mpn: string;
  verdict: Verdict;
  checks: readonly Check[];
}

/** One line for a hint: "closest: X — Junction temperature, running 162 °C, needs ≤ 125 °C". */
export function nearMissLine(m: NearMiss): string {
  return `closest: ${m.mpn} — ${m.misses.map((x) => x.text).join('; ')}`;
}
