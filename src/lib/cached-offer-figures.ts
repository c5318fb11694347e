/**
 * A cached distributor offer (the offers cache the distributor refresh writes) at a shortlist line's
 * need, pure: the order quantity its MOQ gives (a distributor states no order multiple, so 1), the price
 * break at that quantity, the extended cost, the stock against the need, and the words a page shows with
 * the age of the figure. The figures are the last ones fetched; a failed fetch keeps them and says so.
 */
import type { PriceBreak } from './domain/parts.ts';
import { extendedCost, orderQuantity, shortfall, unitPriceAt } from './buying.ts';
import { age, count, money, price } from './units.ts';

/** One cached offer as the shortlist service hands it over (timestamps as ISO strings, UTC). */
export interface CachedOfferInput {
  distributor: string;
  sku: string;
  stockQty: number;
  moq: number;
  currency: string;
  priceBreaks: readonly PriceBreak[];
  leadTimeDays: number | null;
  /** When these figures were fetched. */
  fetchedAt: string;
  /** The last refresh attempt, successful or not. */
  checkedAt: string;
  /** Why the last attempt failed; null when it worked. */
  lastError: string | null;
  /** Not refreshed for longer than the refresh schedule allows, or the last attempt failed. */
  stale: boolean;
}

export interface CachedOfferFigures extends CachedOfferInput {
  orderQty: number;
  /** The break applied (its quantity); null when the order is below the first break. */
  breakQty: number | null;
  unitPrice: number | null;
  extendedCost: number | null;
  shortfall: number;
}

export function cachedOfferAtNeed(offer: CachedOfferInput, need: number): CachedOfferFigures {
  const orderQty = orderQuantity(need, offer.moq, 1);
  const brk = unitPriceAt(offer.priceBreaks, orderQty);
  return {
    ...offer,
    orderQty,
    breakQty: brk?.qty ?? null,
    unitPrice: brk?.unitPrice ?? null,
    extendedCost: brk ? extendedCost(orderQty, brk.unitPrice) : null,
    shortfall: shortfall(need, offer.stockQty),
  };
}

export interface CachedOfferWords {
  /** "Marlpit Components MPC-123456" */
  source: string;
  /** "✓ 1,240 in stock · 0.2480 EUR at 100+ (126.48 EUR for 510) · lead 2 d" */
  figure: string;
  /** Stock covers the need. */
  enough: boolean;
  /** "fetched 3 h ago" */
  age: string;
  /** Set when the last fetch failed or the figure is old: said in words, with the figure kept. */
  warning: string | null;
}

/** The words of one cached offer at `nowMs`, every number through the units formatters. */
export function cachedOfferWords(o: CachedOfferFigures, nowMs: number): CachedOfferWords {
  const stock = o.shortfall > 0 ? `✕ ${count(o.stockQty)} in stock, short by ${count(o.shortfall)}` : `✓ ${count(o.stockQty)} in stock`;
  const priced =
    o.unitPrice === null
      ? '— below the first break'
      : `${price(o.unitPrice, o.currency)} at ${count(o.breakQty)}+ (${money(o.extendedCost, o.currency)} for ${count(o.orderQty)})`;
  const lead = o.leadTimeDays === null ? 'lead time not stated' : `lead ${count(o.leadTimeDays)} d`;
  const fetched = age(nowMs - Date.parse(o.fetchedAt));
  const warning = o.lastError
    ? `Last fetch failed ${age(nowMs - Date.parse(o.checkedAt))} (${o.lastError}); the figure fetched ${fetched} is kept.`
    : o.stale
      ? `Not refreshed lately; the figure fetched ${fetched} is kept.`
      : null;
  return {
    source: `${o.distributor} ${o.sku}`,
    figure: `${stock} · ${priced} · ${lead}${o.moq > 1 ? ` · MOQ ${count(o.moq)}` : ''}`,
    enough: o.shortfall === 0,
    age: `fetched ${fetched}`,
    warning,
  };
}
