/**
 * Distributor offers for people: the cached figures of a part with their age (pages read only the
 * cache, so a slow or failing distributor never holds a page up), and "refresh now" for buyers.
 */
import { db } from '../db.ts';
import { appConfig } from '../config.ts';
import type { SessionUser } from '../auth/types.ts';
import { listPartOffers, refreshState, type CachedOffer } from '../repos/distributor-offers.ts';
import type { CachedOfferInput } from '../../lib/cached-offer-figures.ts';
import { clientOptions } from '../distributor/options.ts';
import { refreshOffers, type RefreshOutcome } from '../distributor/refresh.ts';
import { canManageSupply } from './parts-access.ts';
import { ServiceError } from './errors.ts';
import { age, count, price } from '../../lib/units.ts';

export interface OfferView {
  distributor: string;
  sku: string;
  stockQty: number;
  /** "stock 1,240 · fetched 3 h ago" */
  summary: string;
  moq: string;
  leadTime: string;
  priceBreaks: string;
  fetchedAt: string;
  /** Older than two refresh intervals (or a day when there is no schedule), or the last attempt failed. */
  stale: boolean;
  lastError: string | null;
}

export interface PartOffersView {
  offers: OfferView[];
  lastRefresh: { finishedAt: string | null; ok: boolean | null; outcome: string | null };
}

const DAY_MS = 24 * 3_600_000;

/** How old a cached figure may be before it is called stale: two refresh intervals, or a day without a schedule. */
export function offerStaleAfterMs(): number {
  const refreshMin = appConfig().distributor.refreshMin;
  return refreshMin > 0 ? 2 * refreshMin * 60_000 : DAY_MS;
}

/** A cached offer for the shortlist's figures (src/lib/cached-offer-figures.ts), its staleness judged at `nowMs`. */
export function cachedOfferInput(o: CachedOffer, nowMs: number, staleAfterMs = offerStaleAfterMs()): CachedOfferInput {
  return {
    distributor: o.distributor,
    sku: o.sku,
    stockQty: o.stockQty,
    moq: o.moq,
    currency: o.currency,
    priceBreaks: o.priceBreaks,
    leadTimeDays: o.leadTimeDays,
    fetchedAt: o.fetchedAt.toISOString(),
    checkedAt: o.checkedAt.toISOString(),
    lastError: o.lastError,
    stale: nowMs - o.fetchedAt.getTime() > staleAfterMs || o.lastError !== null,
  };
}

/** The cached offers of a part for buyers and librarians (null for others: they see the curated sources). */
export async function partOffersView(partId: number, user: SessionUser | null, nowMs = Date.now()): Promise<PartOffersView | null> {
  if (!canManageSupply(user)) return null;
  const k = db();
  const [offers, state] = await Promise.all([listPartOffers(k, partId), refreshState(k)]);
  const staleAfterMs = offerStaleAfterMs();
  return {
    offers: offers.map((o) => {
      const ageMs = nowMs - o.fetchedAt.getTime();
      return {
        distributor: o.distributor,
        sku: o.sku,
        stockQty: o.stockQty,
        summary: `stock ${count(o.stockQty)} · fetched ${age(ageMs)}`,
        moq: count(o.moq),
        leadTime: o.leadTimeDays === null ? '—' : `${count(o.leadTimeDays)} days`,
        priceBreaks: o.priceBreaks.map((b) => `${count(b.qty)} → ${price(b.unitPrice, o.currency)}`).join(' · '),
        fetchedAt: o.fetchedAt.toISOString(),
        stale: ageMs > staleAfterMs || o.lastError !== null,
        lastError: o.lastError,
      };
    }),
    lastRefresh: { finishedAt: state.lastFinishedAt?.toISOString() ?? null, ok: state.lastOk, outcome: state.lastOutcome },
  };
}

export type RefreshNowResult = RefreshOutcome & { message: string };

/** Runs one refresh now (a buyer asked); when another server is refreshing, says so and does nothing. */
export async function refreshNow(): Promise<RefreshNowResult> {
  const config = appConfig();
  const url = config.distributor.url;
  if (!url) throw new ServiceError(503, 'No distributor is configured: set DISTRIBUTOR_URL.');
  const outcome = await refreshOffers({ db: db(), client: clientOptions(url, config), lockTtlS: config.distributor.lockS });
  const message = !outcome.ran
    ? 'Another refresh is running; its figures appear when it ends.'
    : outcome.failedBatches > 0
      ? `The distributor did not answer every request; the cached figures stay, marked with the error. ${outcome.errors[0] ?? ''}`.trim()
      : `Refreshed: ${count(outcome.offersWritten)} offers for ${count(outcome.parts)} parts.`;
  return { ...outcome, message };
}
