/**
 * The match's candidates kept in memory between matches. A match used to read its 22,000–35,000
 * candidates with their RDS(on) and Zth points from the database each time (about 0.4 s at 67,000 parts);
 * now the whole candidate catalogue (MOSFETs, drivers and diodes not obsolete, approved or pending, with
 * every price break) is read once and narrowed in memory on the same bounds the SQL narrowing uses
 * (repos/part-candidates.ts candidateQueries), and priced the same way (priceSourcesOf).
 *
 * It is only trusted while the catalogue's version (repos/catalogue-version.ts, kept by triggers on every
 * write to those tables) is the one it was read at: every match reads the version first (one small
 * query); after a change the whole catalogue is read again in the background, in one snapshot with the
 * version, and matches narrow in SQL until it is there. Matches inside a transaction (status flips), with
 * a knex other than the app's, with MATCH_CACHE=off, or on a database without the triggers always read
 * from the database.
 *
 * The part objects are shared by every match and frozen (a write to one throws); a match's pricing puts
 * a copy with its sources in its own list (design-candidates.ts fillSources). Before, each match copied
 * every candidate (24,000–35,000 objects) to fill in a few dozen prices.
 */
import { db, type Db } from '../db.ts';
import { appConfig } from '../config.ts';
import type { CandidatePart, PriceSource } from '../../lib/domain/parts.ts';
import type { CandidateBounds, CandidateRows, SourceBreaks, WholeCandidateRows } from '../repos/part-candidates.ts';
import { loadWholeCandidateRows } from '../repos/part-candidates.ts';
import { catalogueTriggersInstalled, catalogueVersion } from '../repos/catalogue-version.ts';

export interface CandidateSnapshot extends WholeCandidateRows {
  version: string;
  /** When it was read (ms since the epoch), for the health and bench figures. */
  loadedAt: number;
  loadMs: number;
}

const KEY = Symbol.for('stallpoint.candidateCache');
interface CacheState {
  enabled?: Promise<boolean>;
  snapshot: CandidateSnapshot | null;
  loading: Promise<CandidateSnapshot> | null;
  loads: number;
}
const holder = globalThis as typeof globalThis & { [KEY]?: CacheState };
const state = (): CacheState => (holder[KEY] ??= { snapshot: null, loading: null, loads: 0 });

function freezePart(part: { sources: unknown[] }): void {
  Object.freeze(part.sources);
  Object.freeze(part);
}

async function loadSnapshot(): Promise<CandidateSnapshot> {
  const t0 = performance.now();
  const snapshot = await db().transaction(
    async (trx) => {
      const version = await catalogueVersion(trx);
      return { version, ...(await loadWholeCandidateRows(trx)) };
    },
    { isolationLevel: 'repeatable read' },
  );
  for (const { part } of snapshot.mosfets) freezePart(part);
  for (const part of snapshot.drivers) freezePart(part);
  for (const part of snapshot.diodes) freezePart(part);
  const s = state();
  s.loads += 1;
  s.snapshot = { ...snapshot, loadedAt: Date.now(), loadMs: performance.now() - t0 };
  return s.snapshot;
}

/** Whether the in-memory candidates serve matches made with `k` (the app's own knex, outside a transaction). */
async function cacheServes(k: Db): Promise<boolean> {
  if (k !== db() || appConfig().matchCache === 'off') return false;
  const s = state();
  s.enabled ??= catalogueTriggersInstalled(db()).catch(() => {
    s.enabled = undefined;
    return false;
  });
  return s.enabled;
}

/**
 * The candidate catalogue as of now, or null when the match is to read from the database: always with a
 * knex other than the app's, in a transaction, with MATCH_CACHE=off or without the triggers; and while the
 * snapshot is older than the current version (after any write to the catalogue) — then a new snapshot is
 * read in the background (one at a time) and the matches meanwhile narrow in SQL as before, so no match
 * waits for the whole catalogue (about 3 s at 67,000 parts) and none sees an old one.
 */
export async function currentCandidates(k: Db): Promise<CandidateSnapshot | null> {
  if (!(await cacheServes(k))) return null;
  const s = state();
  const version = await catalogueVersion(db());
  if (s.snapshot?.version === version) return s.snapshot;
  if (!s.loading) {
    s.snapshot = null; // stale: free it before the new one is read
    s.loading = loadSnapshot().finally(() => (s.loading = null));
    s.loading.catch((err: unknown) => console.warn(`[stallpoint] reading the match candidates failed: ${String(err)}`));
  }
  return null;
}

/** Waits for a background read of the candidates, if one runs (tests, bench). */
export async function candidatesSettled(): Promise<void> {
  await state().loading?.catch(() => undefined);
}

/** Drops the in-memory candidates and forgets whether the triggers exist (tests; after a migration). */
export function forgetCandidates(): void {
  holder[KEY] = { snapshot: null, loading: null, loads: 0 };
}

/** How many times the whole catalogue was read since start (or forgetCandidates). */
export const candidateLoads = (): number => state().loads;

/** Starts reading the catalogue in the background (server start), so the first matches find it. */
export function warmCandidates(): void {
  void currentCandidates(db()).catch(() => undefined);
}

/**
 * The candidates of one design from the snapshot: the same parts, in the same order (by id), as the SQL
 * narrowing of repos/part-candidates.ts (candidateQueries) returns for these bounds, the snapshot's own
 * (frozen) objects without sources; totals as countOf gives them.
 */
export function candidatesOf(snapshot: WholeCandidateRows, bounds: CandidateBounds, includePending: boolean): CandidateRows {
  const eligible = (p: { reviewStatus: string }) => includePending || p.reviewStatus === 'approved';
  const picks = new Set(bounds.switchPickIds);
  const totals = { mosfet: 0, driver: 0, diode: 0 };
  const mosfets: CandidatePart<'mosfet'>[] = [];
  for (const { part, minRdsOnVgsV } of snapshot.mosfets) {
    if (!eligible(part)) continue;
    totals.mosfet += 1;
    const p = part.params;
    if (p.channel !== 'n' || p.vdsMaxV < bounds.supplyMaxV || p.idPulsedA < bounds.stallCurrentMaxA) continue;
    const drivable = minRdsOnVgsV <= bounds.switchGateMaxV && p.vgsThMaxV <= bounds.switchGateMaxV;
    if (drivable || (part.id != null && picks.has(part.id))) mosfets.push(part);
  }
  const drivers: CandidatePart<'driver'>[] = [];
  for (const part of snapshot.drivers) {
    if (!eligible(part)) continue;
    totals.driver += 1;
    if (part.params.supplyMinV <= bounds.driverSupplyMinV && part.params.supplyMaxV >= bounds.driverSupplyMaxV) drivers.push(part);
  }
  const diodes: CandidatePart<'diode'>[] = [];
  for (const part of snapshot.diodes) {
    if (!eligible(part)) continue;
    totals.diode += 1;
    if (part.params.vrrmV >= bounds.supplyMaxV) diodes.push(part);
  }
  return { mosfets, drivers, diodes, totals };
}

/**
 * Per source only the price break that applies at `qty`: the largest at or below the quantity or the
 * source's MOQ, whichever is higher; a source without one is left out (as priceSourcesOf in SQL).
 */
export function sourcesAt(sources: readonly SourceBreaks[], qty: number): PriceSource[] {
  const out: PriceSource[] = [];
  for (const s of sources) {
    const limit = Math.max(qty, s.moq);
    let best: { qty: number; unitPrice: number } | null = null;
    for (const b of s.breaks) if (b.qty <= limit && (best == null || b.qty > best.qty)) best = b;
    if (best) out.push({ moq: s.moq, currency: s.currency, priceBreaks: [{ qty: best.qty, unitPrice: best.unitPrice }] });
  }
  return out;
}

/** The price sources of the given parts at a quantity, from the snapshot (parts without any are absent). */
export function priceSourcesFrom(snapshot: WholeCandidateRows, partIds: Iterable<number>, qty: number): Map<number, PriceSource[]> {
  const out = new Map<number, PriceSource[]>();
  for (const id of partIds) {
    const sources = snapshot.sources.get(id);
    if (!sources) continue;
    const at = sourcesAt(sources, qty);
    if (at.length) out.set(id, at);
  }
  return out;
}
