/**
 * The distributor offers cache and the refresh lock (see the two distributor_* migrations). Every SQL
 * statement of the distributor feature lives here.
 */
import type { Db } from '../db.ts';

export interface PriceBreakRow {
  qty: number;
  unitPrice: number;
}

/** A cached offer: the figures as fetched, with when they were fetched and the last fetch's error. */
export interface CachedOffer extends FetchedOffer {
  id: number;
  fetchedAt: Date;
  checkedAt: Date;
  lastError: string | null;
}

interface DbOfferRow {
  id: number;
  part_id: number;
  mpn: string;
  distributor: string;
  sku: string;
  stock_qty: number;
  moq: number;
  currency: string;
  price_breaks: string | PriceBreakRow[];
  lead_time_days: number | null;
  fetched_at: Date;
  checked_at: Date;
  last_error: string | null;
}

function fromRow(row: DbOfferRow): CachedOffer {
  return {
    id: row.id,
    partId: row.part_id,
    mpn: row.mpn,
    distributor: row.distributor,
    sku: row.sku,
    stockQty: row.stock_qty,
    moq: row.moq,
    currency: row.currency,
    priceBreaks: typeof row.price_breaks === 'string' ? (JSON.parse(row.price_breaks) as PriceBreakRow[]) : row.price_breaks,
    leadTimeDays: row.lead_time_days,
    fetchedAt: row.fetched_at,
    checkedAt: row.checked_at,
    lastError: row.last_error,
  };
}

/** The cached offers of a part, by distributor. */
export async function listPartOffers(db: Db, partId: number): Promise<CachedOffer[]> {
  const rows = (await db('distributor_offers').where({ part_id: partId }).orderBy('distributor')) as DbOfferRow[];
  return rows.map(fromRow);
}

/** The cached offers of several parts, by part id then distributor (parts without one are absent). */
export async function listOffersOfParts(db: Db, partIds: readonly number[]): Promise<Map<number, CachedOffer[]>> {
  const byPart = new Map<number, CachedOffer[]>();
  const ids = [...new Set(partIds)];
  if (ids.length === 0) return byPart;
  const rows = (await db('distributor_offers').whereIn('part_id', ids).orderBy(['part_id', 'distributor'])) as DbOfferRow[];
  for (const offer of rows.map(fromRow)) byPart.set(offer.partId, [...(byPart.get(offer.partId) ?? []), offer]);
  return byPart;
}

/** What the refresh asks for: every approved part's id and part number. */
export async function partsToRefresh(db: Db): Promise<{ id: number; mpn: string }[]> {
  return db('parts').select('id', 'mpn').where({ review_status: 'approved' }).orderBy('id');
}

export interface FetchedOffer {
  partId: number;
  mpn: string;
  distributor: string;
  sku: string;
  stockQty: number;
  moq: number;
  currency: string;
  priceBreaks: PriceBreakRow[];
  leadTimeDays: number | null;
}

/** Writes fresh figures for a part and distributor (insert or replace), clearing any earlier error. */
export async function upsertOffer(db: Db, offer: FetchedOffer, at: Date): Promise<void> {
  const figures = {
    mpn: offer.mpn,
    sku: offer.sku,
    stock_qty: offer.stockQty,
    moq: offer.moq,
    currency: offer.currency,
    price_breaks: JSON.stringify(offer.priceBreaks),
    lead_time_days: offer.leadTimeDays,
    fetched_at: at,
    checked_at: at,
    last_error: null,
  };
  await db('distributor_offers')
    .insert({ part_id: offer.partId, distributor: offer.distributor, ...figures })
    .onConflict(['part_id', 'distributor'])
    .merge(figures);
}

/**
 * Records a failed attempt on the cached rows of these parts (every distributor, or one), keeping their
 * figures and fetched_at. Returns how many rows were marked.
 */
export async function markOffersFailed(db: Db, partIds: number[], error: string, at: Date, distributor?: string): Promise<number> {
  if (partIds.length === 0) return 0;
  const q = db('distributor_offers').whereIn('part_id', partIds);
  if (distributor) q.where({ distributor });
  return q.update({ last_error: error.slice(0, 500), checked_at: at });
}

export interface RefreshState {
  holder: string | null;
  lockedUntil: Date | null;
  lastStartedAt: Date | null;
  lastFinishedAt: Date | null;
  lastOutcome: string | null;
  lastOk: boolean | null;
}

const JOB = 'offers';

/**
 * Takes the refresh lock for `ttlS` seconds when it is free or expired: one atomic UPDATE, so of two
 * servers asking at once exactly one gets it. With `minGapS`, also only when no refresh started within
 * that many seconds (a scheduled round already done by another server). True when this holder now has it.
 */
export async function tryLockRefresh(db: Db, holder: string, ttlS: number, minGapS = 0): Promise<boolean> {
  const q = db('distributor_refresh')
    .where({ job: JOB })
    .where((w) => w.whereNull('locked_until').orWhere('locked_until', '<', db.fn.now(3)));
  if (minGapS > 0)
    q.where((w) =>
      w
        .whereNull('last_started_at')
        .orWhere('last_started_at', '<=', db.raw('NOW(3) - INTERVAL ? MICROSECOND', [Math.round(minGapS * 1e6)])),
    );
  const changed = await q.update({
    holder,
    locked_until: db.raw('NOW(3) + INTERVAL ? SECOND', [ttlS]),
    last_started_at: db.fn.now(3),
  });
  return changed === 1;
}

/** Frees the lock (only when this holder still has it) and records the outcome. */
export async function unlockRefresh(db: Db, holder: string, outcome: { ok: boolean; text: string }): Promise<void> {
  await db('distributor_refresh')
    .where({ job: JOB, holder })
    .update({
      holder: null,
      locked_until: null,
      last_finished_at: db.fn.now(3),
      last_ok: outcome.ok,
      last_outcome: outcome.text.slice(0, 1000),
    });
}

export async function refreshState(db: Db): Promise<RefreshState> {
  const row = await db('distributor_refresh').where({ job: JOB }).first();
  return {
    holder: row?.holder ?? null,
    lockedUntil: row?.locked_until ?? null,
    lastStartedAt: row?.last_started_at ?? null,
    lastFinishedAt: row?.last_finished_at ?? null,
    lastOutcome: row?.last_outcome ?? null,
    lastOk: row?.last_ok === null || row?.last_ok === undefined ? null : Boolean(row.last_ok),
  };
}
