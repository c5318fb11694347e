/**
 * What the match routes answer: each ranked list cut to the best N (from `offset`), with the counts by
 * verdict and why the rest fail, worked out on the FULL ranking. The designer's picks (chosen and
 * alternates) and the suggested picks always travel with the page, wherever they rank, so the workspace
 * and its readiness view judge them exactly as the server does. Pure: the service ranks, this cuts.
 */
import type { DesignInput } from './domain/design.ts';
import type { Check, Verdict } from './checks.ts';
import { checkLabel, checkLabelInline } from './design-words.ts';
import { nearMisses, type NearMiss, type NearMissEntry } from './compare.ts';
import {
  catalogueParts,
  chosenPackageOf,
  decorateEntry,
  matchHead,
  matchOrder,
  suggestSelections,
  tieEnd,
  usableForPick,
  type DesignMatch,
  type MatchCatalogue,
  type PreparedCase,
} from './design-match.ts';
import type { MotorParams } from './domain/parts.ts';
import type { DesignRanking, RankingJudges } from './rank-design.ts';
import { DEFAULT_MATCH_LIMIT, MAX_MATCH_LIMIT } from './schemas/design.ts';
import { runSteps, type Steps } from './slices.ts';

export const MATCH_LIST_KEYS = ['switch', 'switchWithDriver', 'driver', 'diode'] as const;
export type MatchListKey = (typeof MATCH_LIST_KEYS)[number];

export { DEFAULT_MATCH_LIMIT, MAX_MATCH_LIMIT };

export interface MatchListSummary {
  /** Entries in the full ranking. */
  total: number;
  offset: number;
  limit: number;
  /** How many of the full ranking have each verdict. */
  counts: { pass: number; marginal: number; fail: number };
  /** Failing parts per hard check they break, most common first (a part breaking two checks counts in both). */
  failing: { checkId: string; label: string; count: number }[];
  /** One line: "1,204 pass · 8 marginal · 25,412 fail — 25,001 fail gate drive, …". */
  summary: string;
  /** When nothing in the full ranking passes: the closest candidates and what they miss (else empty). */
  nearMisses: NearMiss[];
}

/** Position of the entry in the full ranking (1 = best); the page and the pinned picks carry it. */
export interface Ranked {
  rank: number;
  /** True for a pick (or suggestion) shown although it ranks outside the page. */
  pinned: boolean;
}

type Lists = { [K in MatchListKey]: (DesignMatch[K][number] & Ranked)[] };

export type DesignMatchPage = Omit<DesignMatch, MatchListKey> &
  Lists & {
    lists: Record<MatchListKey, MatchListSummary>;
    /** The default picks worked out on the full ranking (suggestSelections). */
    suggested: DesignInput['selections'];
  };

const hardFail = (c: Check) => !c.ok && c.severity !== 'margin';
const thousands = (n: number) => n.toLocaleString('en-US');

export function summarizeList(
  list: readonly { partId: number | null; mpn: string; verdict: Verdict; checks: readonly Check[] }[],
  offset: number,
  limit: number,
  inFull?: (e: NearMissEntry) => NearMissEntry,
): MatchListSummary {
  const counts = { pass: 0, marginal: 0, fail: 0 };
  const byCheck = new Map<string, number>();
  for (const e of list) {
    if (e.verdict === 'pass' || e.verdict === 'marginal' || e.verdict === 'fail') counts[e.verdict]++;
    if (e.verdict !== 'fail') continue;
    for (const c of e.checks) if (hardFail(c)) byCheck.set(c.id, (byCheck.get(c.id) ?? 0) + 1);
  }
  const failing = [...byCheck.entries()]
    .sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0]))
    .map(([checkId, count]) => ({ checkId, label: checkLabel(checkId), count }));
  const head = `${thousands(counts.pass)} pass · ${thousands(counts.marginal)} marginal · ${thousands(counts.fail)} fail`;
  const why = failing
    .slice(0, 4)
    .map((f) => `${thousands(f.count)} fail ${checkLabelInline(f.checkId)}`)
    .join(', ');
  return {
    total: list.length,
    offset,
    limit,
    counts,
    failing,
    summary: why ? `${head} — ${why}` : head,
    nearMisses: nearMisses(list, 3, inFull),
  };
}

function cut<T extends { partId?: number | null }>(
  list: readonly T[],
  offset: number,
  limit: number,
  pinIds: ReadonlySet<number>,
): (T & Ranked)[] {
  const out: (T & Ranked)[] = [];
  list.forEach((e, i) => {
    const inPage = i >= offset && i < offset + limit;
    if (inPage || (e.partId != null && pinIds.has(e.partId))) out.push({ ...e, rank: i + 1, pinned: !inPage });
  });
  return out;
}

/** The parts a page carries whatever their rank: the designer's picks and the suggested ones, per list. */
function pinsOf(input: DesignInput, suggested: DesignInput['selections']): Record<MatchListKey, Set<number>> {
  const idsOf = (role: 'switch' | 'driver' | 'diode') => {
    const ids = new Set<number>();
    for (const sel of [input.selections[role], suggested[role]]) {
      if (sel.chosenPartId != null) ids.add(sel.chosenPartId);
      for (const id of sel.alternatePartIds) ids.add(id);
    }
    return ids;
  };
  return { switch: idsOf('switch'), switchWithDriver: idsOf('switch'), driver: idsOf('driver'), diode: idsOf('diode') };
}

/** The answer of the match routes: `limit` entries per list from `offset`, plus every pick. */
export function pageMatch(
  match: DesignMatch,
  input: DesignInput,
  { limit = DEFAULT_MATCH_LIMIT, offset = 0 }: { limit?: number; offset?: number } = {},
): DesignMatchPage {
  const suggested = suggestSelections(match);
  const pins = pinsOf(input, suggested);
  const summaries = Object.fromEntries(MATCH_LIST_KEYS.map((k) => [k, summarizeList(match[k], offset, limit)])) as Record<
    MatchListKey,
    MatchListSummary
  >;
  return {
    ...match,
    switch: cut(match.switch, offset, limit, pins.switch),
    switchWithDriver: cut(match.switchWithDriver, offset, limit, pins.switchWithDriver),
    driver: cut(match.driver, offset, limit, pins.driver),
    diode: cut(match.diode, offset, limit, pins.diode),
    lists: summaries,
    suggested,
  };
}

/**
 * The answer of the match routes from a lean ranking (rankDesignLean): the same as
 * pageMatch(matchFromRanking(the full ranking), input, page), with only the entries the page carries
 * (its slice, the picks, the suggestions, the closest misses) judged again in full and decorated. Counts,
 * failure summaries, order and suggestions read the lean entries (verdict, score, failing checks), which
 * the full ranking has the same. Prices: whatever the catalogue's parts carry (see idsNeedingPrice).
 */
export function leanMatchPage(
  input: DesignInput,
  motorLabel: string,
  motor: MotorParams,
  catalogue: MatchCatalogue,
  prepared: PreparedCase,
  lean: { ranking: DesignRanking; judges: RankingJudges },
  page: { limit?: number; offset?: number } = {},
): DesignMatchPage {
  return runSteps(leanMatchPageSteps(input, motorLabel, motor, catalogue, prepared, lean, page));
}

/** leanMatchPage pausing after each list is put in match order and before the page is cut (src/lib/slices.ts). */
export function* leanMatchPageSteps(
  input: DesignInput,
  motorLabel: string,
  motor: MotorParams,
  catalogue: MatchCatalogue,
  prepared: PreparedCase,
  { ranking, judges }: { ranking: DesignRanking; judges: RankingJudges },
  { limit = DEFAULT_MATCH_LIMIT, offset = 0 }: { limit?: number; offset?: number } = {},
): Steps<DesignMatchPage> {
  const qty = input.boardQuantity;
  const parts = catalogueParts(catalogue);
  // Only the tie groups whose inner order can show are ordered by price and lifecycle (matchOrder).
  const visible = idsNeedingPrice(ranking, input, { offset, limit });
  yield;
  const ordered = {} as { [K in MatchListKey]: DesignRanking[K] };
  for (const k of MATCH_LIST_KEYS) {
    (ordered as Record<MatchListKey, unknown>)[k] = matchOrder(ranking[k] as CandidateLike[], parts, qty, visible);
    yield;
  }
  const suggested = suggestSelections({ driverNeeded: ranking.driverNeeded, ...ordered });
  const pins = pinsOf(input, suggested);
  const sel = input.selections;
  const chosen: Record<MatchListKey, number | null> = {
    switch: sel.switch.chosenPartId,
    switchWithDriver: sel.switch.chosenPartId,
    driver: sel.driver.chosenPartId,
    diode: sel.diode.chosenPartId,
  };
  // The entry as the full ranking has it: judged again with every check and note, at the list's drive.
  const full = {
    switch: (e: DesignRanking['switch'][number]) => fullOf(e, judges.switch),
    switchWithDriver: (e: DesignRanking['switch'][number]) => fullOf(e, judges.switchWithDriver),
    driver: (e: DesignRanking['driver'][number]) => fullOf(e, judges.driver),
    diode: (e: DesignRanking['diode'][number]) => fullOf(e, judges.diode),
  };
  function fullOf<E extends { partId: number | null }, P>(e: E, judge: (part: P) => E): E {
    const part = e.partId == null ? undefined : parts.get(e.partId);
    return part ? judge(part as P) : e;
  }
  function pageOf<K extends MatchListKey>(k: K): Lists[K] {
    const list = ordered[k] as readonly DesignRanking[K][number][];
    const inFull = full[k] as (e: DesignRanking[K][number]) => DesignRanking[K][number];
    const chosenPackage = chosenPackageOf(parts, chosen[k]);
    const out: Lists[K][number][] = [];
    list.forEach((e, i) => {
      const inPage = i >= offset && i < offset + limit;
      if (!inPage && !(e.partId != null && pins[k].has(e.partId))) return;
      const part = e.partId == null ? undefined : parts.get(e.partId);
      const entry = decorateEntry(inFull(e), part, qty, chosen[k], chosenPackage);
      out.push({ ...entry, rank: i + 1, pinned: !inPage } as unknown as Lists[K][number]);
    });
    return out as Lists[K];
  }
  const lists = Object.fromEntries(
    MATCH_LIST_KEYS.map((k) => [k, summarizeList(ordered[k], offset, limit, full[k] as unknown as (e: NearMissEntry) => NearMissEntry)]),
  ) as Record<MatchListKey, MatchListSummary>;
  yield;
  return {
    ...matchHead(input, motorLabel, motor, catalogue, prepared, ranking),
    switch: pageOf('switch'),
    switchWithDriver: pageOf('switchWithDriver'),
    driver: pageOf('driver'),
    diode: pageOf('diode'),
    lists,
    suggested,
  };
}

/**
 * The parts whose price can show in `pageMatch(…, page)`: price only breaks ties of verdict and score, so
 * every tie group that reaches the page, holds a pick, or holds one of the parts a suggestion can take
 * (the groups from the top until four usable parts are in) is priced; any other group stays in its place
 * whatever its prices, and its own order is never shown. Pure: read off the engine's ranking.
 */
export function idsNeedingPrice(
  ranking: Pick<DesignRanking, MatchListKey>,
  input: DesignInput,
  page: { offset: number; limit: number },
): Set<number> {
  const out = new Set<number>();
  const lists = ranking as Record<MatchListKey, readonly CandidateLike[]>;
  const pins: Record<'switch' | 'driver' | 'diode', Set<number>> = { switch: new Set(), driver: new Set(), diode: new Set() };
  for (const role of ['switch', 'driver', 'diode'] as const) {
    const sel = input.selections[role];
    if (sel.chosenPartId != null) pins[role].add(sel.chosenPartId);
    for (const id of sel.alternatePartIds) pins[role].add(id);
  }
  // Whatever a suggestion may pick (the usable parts in the top groups of a list) is pinned like a pick.
  for (const k of MATCH_LIST_KEYS) {
    const list = lists[k];
    let usable = 0;
    for (let start = 0; start < list.length && usable < 4;) {
      const end = tieEnd(list, start);
      for (let i = start; i < end; i++) {
        const e = list[i];
        if (!usableForPick(e) || e.partId == null) continue;
        usable++;
        pins[roleOf(k)].add(e.partId);
      }
      start = end;
    }
  }
  // The tie groups (index ranges, read in place) that reach the page or hold a pin are priced whole.
  for (const k of MATCH_LIST_KEYS) {
    const list = lists[k];
    const pinned = pins[roleOf(k)];
    for (let start = 0; start < list.length;) {
      const end = tieEnd(list, start);
      const onPage = start < page.offset + page.limit && end > page.offset;
      let priced = onPage;
      for (let i = start; !priced && i < end; i++) priced = list[i].partId != null && pinned.has(list[i].partId as number);
      if (priced) for (let i = start; i < end; i++) if (list[i].partId != null) out.add(list[i].partId as number);
      start = end;
    }
  }
  return out;
}

type CandidateLike = DesignRanking['switch'][number] | DesignRanking['driver'][number] | DesignRanking['diode'][number];
const roleOf = (k: MatchListKey): 'switch' | 'driver' | 'diode' => (k === 'switchWithDriver' ? 'switch' : k);
