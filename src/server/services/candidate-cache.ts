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
import type { CandidateBounds, CandidateRows, WholeCandidateRows } from '../repos/part-candidates.ts';
import { readWholeCandidateRows, wholeCandidatesFromRows } from '../repos/part-candidates.ts';
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
  // The version and the rows in one consistent read; turning the rows into parts (in slices) after it,
  // so no transaction or pool connection is held while other requests take their turns.
  const read = await db().transaction(async (trx) => ({ version: await catalogueVersion(trx), rows: await readWholeCandidateRows(trx) }), {
    isolationLevel: 'repeatable read',
  });
  const snapshot = { version: read.version, ...(await wholeCandidatesFromRows(read.rows)) };
  for (const { part } of snapshot.mosfets) freezePart(part);
  for (const part of snapshot.drivers) freezePart(part);
  for (const part of snapshot.diodes) freezePart(part);
  const s = state();
  s.loads += 1;
  s.snapshot = { ...snapshot, loadedAt: Date.now(), loadMs: performance.now() - t0 };
  columnsOf(s.snapshot); // the narrowing's columns now, not in the first match after a reload
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
 * The fields the narrowing reads, one typed array per field in snapshot order: a match narrows 67,000
 * parts, and reading them from the part objects (spread over the heap) took about 20 ms a match, from
 * these about 1 ms. Numbers as the comparisons read them (a missing one is NaN, a null one 0).
 */
interface NarrowingColumns {
  mosfetApproved: Uint8Array;
  mosfetN: Uint8Array;
  vdsMaxV: Float64Array;
  idPulsedA: Float64Array;
  minRdsOnVgsV: Float64Array;
  vgsThMaxV: Float64Array;
  driverApproved: Uint8Array;
  driverSupplyMinV: Float64Array;
  driverSupplyMaxV: Float64Array;
  diodeApproved: Uint8Array;
  vrrmV: Float64Array;
}

/** Per snapshot (which never changes once read): built as it loads, or on first use for any other. */
const columnsOfSnapshot = new WeakMap<WholeCandidateRows, NarrowingColumns>();

function columnsOf(snapshot: WholeCandidateRows): NarrowingColumns {
  const known = columnsOfSnapshot.get(snapshot);
  if (known) return known;
  const m = snapshot.mosfets.length;
  const cols: NarrowingColumns = {
    mosfetApproved: new Uint8Array(m),
    mosfetN: new Uint8Array(m),
    vdsMaxV: new Float64Array(m),
    idPulsedA: new Float64Array(m),
    minRdsOnVgsV: new Float64Array(m),
    vgsThMaxV: new Float64Array(m),
    driverApproved: new Uint8Array(snapshot.drivers.length),
    driverSupplyMinV: new Float64Array(snapshot.drivers.length),
    driverSupplyMaxV: new Float64Array(snapshot.drivers.length),
    diodeApproved: new Uint8Array(snapshot.diodes.length),
    vrrmV: new Float64Array(snapshot.diodes.length),
  };
  snapshot.mosfets.forEach(({ part, minRdsOnVgsV }, i) => {
    cols.mosfetApproved[i] = part.reviewStatus === 'approved' ? 1 : 0;
    cols.mosfetN[i] = part.params.channel === 'n' ? 1 : 0;
    cols.vdsMaxV[i] = part.params.vdsMaxV;
    cols.idPulsedA[i] = part.params.idPulsedA;
    cols.minRdsOnVgsV[i] = minRdsOnVgsV;
    cols.vgsThMaxV[i] = part.params.vgsThMaxV;
  });
  snapshot.drivers.forEach((part, i) => {
    cols.driverApproved[i] = part.reviewStatus === 'approved' ? 1 : 0;
    cols.driverSupplyMinV[i] = part.params.supplyMinV;
    cols.driverSupplyMaxV[i] = part.params.supplyMaxV;
  });
  snapshot.diodes.forEach((part, i) => {
    cols.diodeApproved[i] = part.reviewStatus === 'approved' ? 1 : 0;
    cols.vrrmV[i] = part.params.vrrmV;
  });
  columnsOfSnapshot.set(snapshot, cols);
  return cols;
}

/**
 * The candidates of one design from the snapshot: the same parts, in the same order (by id), as the SQL
 * narrowing of repos/part-candidates.ts (candidateQueries) returns for these bounds, the snapshot's own
 * (frozen) objects without sources; totals as countOf gives them. The snapshot holds approved and pending
 * parts only (readWholeCandidateRows), so "eligible" is approved, or any with includePending.
 */
export function candidatesOf(snapshot: WholeCandidateRows, bounds: CandidateBounds, includePending: boolean): CandidateRows {
  const cols = columnsOf(snapshot);
  const picks = new Set(bounds.switchPickIds);
  const totals = { mosfet: 0, driver: 0, diode: 0 };
  const mosfets: CandidatePart<'mosfet'>[] = [];
  const gateMaxV = bounds.switchGateMaxV;
  for (let i = 0; i < snapshot.mosfets.length; i++) {
    if (!includePending && cols.mosfetApproved[i] === 0) continue;
    totals.mosfet += 1;
    if (cols.mosfetN[i] === 0 || cols.vdsMaxV[i] < bounds.supplyMaxV || cols.idPulsedA[i] < bounds.stallCurrentMaxA) continue;
    const drivable = cols.minRdsOnVgsV[i] <= gateMaxV && cols.vgsThMaxV[i] <= gateMaxV;
    if (drivable) mosfets.push(snapshot.mosfets[i].part);
    else if (picks.size > 0) {
      const part = snapshot.mosfets[i].part;
      if (part.id != null && picks.has(part.id)) mosfets.push(part);
    }
  }
  const drivers: CandidatePart<'driver'>[] = [];
  for (let i = 0; i < snapshot.drivers.length; i++) {
    if (!includePending && cols.driverApproved[i] === 0) continue;
    totals.driver += 1;
    if (cols.driverSupplyMinV[i] <= bounds.driverSupplyMinV && cols.driverSupplyMaxV[i] >= bounds.driverSupplyMaxV)
      drivers.push(snapshot.drivers[i]);
  }
  const diodes: CandidatePart<'diode'>[] = [];
  for (let i = 0; i < snapshot.diodes.length; i++) {
    if (!includePending && cols.diodeApproved[i] === 0) continue;
    totals.diode += 1;
    if (cols.vrrmV[i] >= bounds.supplyMaxV) diodes.push(snapshot.diodes[i]);
  }
  return { mosfets, drivers, diodes, totals };
}

/** The price sources of the given parts at a quantity, from the snapshot (parts without any are absent). */
export function priceSourcesFrom(snapshot: WholeCandidateRows, partIds: Iterable<number>, qty: number): Map<number, PriceSource[]> {
  const out = new Map<number, PriceSource[]>();
  for (const id of partIds) {
    const at = snapshot.sources.at(id, qty);
    if (at) out.set(id, at);
  }
  return out;
}
