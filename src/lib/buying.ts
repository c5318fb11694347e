/**
 * The buyer's arithmetic, pure: how many to order for a build, the price at that quantity from a
 * source's price breaks, the extended cost, its value in the organisation's currency, and the shortfall
 * against stock. No I/O; the shortlist service feeds it catalogue rows and the rates table.
 */
import type { PriceBreak } from './domain/parts.ts';
import { tidy } from './units.ts';

/** Removes floating-point noise before a ceiling: 100 × 1.1 is 110.00000000000001 in binary. */
const clean = tidy;

/**
 * Units needed for a build: per-board quantity × boards, plus attrition (spares for set-up loss and
 * rework, in percent), rounded up to whole parts.
 */
export function quantityNeeded(perBoard: number, boards: number, attritionPct: number): number {
  if (perBoard <= 0 || boards <= 0) return 0;
  return Math.ceil(clean((perBoard * boards * (100 + attritionPct)) / 100));
}

/**
 * What a source lets you order to cover `need`: at least its minimum order quantity, then rounded up
 * to whole order multiples (reels, tubes, packs). Zero need orders nothing.
 */
export function orderQuantity(need: number, moq: number, orderMultiple: number): number {
  if (need <= 0) return 0;
  const multiple = Math.max(1, Math.floor(orderMultiple));
  const atLeast = Math.max(need, moq, 1);
  return Math.ceil(clean(atLeast / multiple)) * multiple;
}

/** The unit price at a quantity: the highest price break at or below it; null below the first break. */
export function unitPriceAt(breaks: readonly PriceBreak[], qty: number): PriceBreak | null {
  let best: PriceBreak | null = null;
  for (const b of breaks) if (b.qty <= qty && (!best || b.qty > best.qty)) best = b;
  return best;
}

/** Money to the cent, half away from zero, without binary noise (1.005 → 1.01). */
export function roundMoney(amount: number): number {
  const cents = clean(Math.abs(amount) * 100);
  return (Math.sign(amount) * Math.round(cents)) / 100;
}

/** Extended cost of a line in the source's currency, to the cent. */
export function extendedCost(qty: number, unitPrice: number): number {
  return roundMoney(qty * unitPrice);
}

/** One row of the rates table: one unit of `currency` is worth `rateToOrg` units of the organisation's currency. */
export interface CurrencyRate {
  currency: string;
  rateToOrg: number;
  /** The day the rate was set, YYYY-MM-DD. */
  asOf: string;
}

export interface Converted {
  amount: number;
  rateToOrg: number;
  /** Null when no conversion was needed (the amount already was in the organisation's currency). */
  asOf: string | null;
}

/** An amount in the organisation's currency, to the cent; null when the rates table has no row for it. */
export function convertToOrg(amount: number, currency: string, orgCurrency: string, rates: readonly CurrencyRate[]): Converted | null {
  if (currency.toUpperCase() === orgCurrency.toUpperCase()) return { amount: roundMoney(amount), rateToOrg: 1, asOf: null };
  const rate = rates.find((r) => r.currency.toUpperCase() === currency.toUpperCase());
  if (!rate) return null;
  return { amount: roundMoney(amount * rate.rateToOrg), rateToOrg: rate.rateToOrg, asOf: rate.asOf };
}

/** Units missing for a build: need − stock when positive, else 0. */
export function shortfall(need: number, stockQty: number): number {
  return Math.max(0, need - stockQty);
}

/** The supply facts of one source that the buying figures need. */
export interface BuyingSource {
  id?: number;
  distributor: string;
  sku: string;
  moq: number;
  orderMultiple: number;
  stockQty: number;
  leadTimeDays: number;
  currency: string;
  priceBreaks: readonly PriceBreak[];
}

/** One source's figures for a need. */
export interface SourceQuote {
  source: BuyingSource;
  orderQty: number;
  unitPrice: number | null;
  /** Price break applied (its quantity), null when the order quantity is below the first break. */
  breakQty: number | null;
  extendedCost: number | null;
  /** Extended cost in the organisation's currency; null without a price or without a rate. */
  converted: Converted | null;
}

export function quoteSource(source: BuyingSource, need: number, orgCurrency: string, rates: readonly CurrencyRate[]): SourceQuote {
  const orderQty = orderQuantity(need, source.moq, source.orderMultiple);
  const brk = unitPriceAt(source.priceBreaks, orderQty);
  const ext = brk ? extendedCost(orderQty, brk.unitPrice) : null;
  return {
    source,
    orderQty,
    unitPrice: brk?.unitPrice ?? null,
    breakQty: brk?.qty ?? null,
    extendedCost: ext,
    converted: ext === null ? null : convertToOrg(ext, source.currency, orgCurrency, rates),
  };
}

/**
 * The source to buy from: the preferred one when it is given and still listed, otherwise the lowest
 * extended cost in the organisation's currency (ties: more stock, then shorter lead time). Sources that
 * cannot be priced in the organisation's currency come last. Null when the part has no source.
 */
export function pickSource(quotes: readonly SourceQuote[], preferredSourceId: number | null = null): SourceQuote | null {
  if (quotes.length === 0) return null;
  const preferred = preferredSourceId == null ? undefined : quotes.find((q) => q.source.id === preferredSourceId);
  if (preferred) return preferred;
  const cost = (q: SourceQuote): number => q.converted?.amount ?? Number.POSITIVE_INFINITY;
  return [...quotes].sort(
    (a, b) => cost(a) - cost(b) || b.source.stockQty - a.source.stockQty || a.source.leadTimeDays - b.source.leadTimeDays,
  )[0];
}
