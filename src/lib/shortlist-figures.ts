/**
 * The figures of one design's shortlist at a build quantity, pure: per line the quantity needed, per
 * option (chosen part and alternates) the source bought from, its price at the order quantity, extended
 * cost, converted cost, stock against need; per design the total of the chosen options in the
 * organisation's currency with the rates (and their dates) it used. Generic lines (the pull resistor)
 * have no catalogue price: they are listed with their need and left out of the total, said so.
 */
import type { Lifecycle } from './domain/parts.ts';
import {
  pickSource,
  quantityNeeded,
  quoteSource,
  roundMoney,
  shortfall,
  type BuyingSource,
  type CurrencyRate,
  type SourceQuote,
} from './buying.ts';
import { cachedOfferAtNeed, type CachedOfferFigures, type CachedOfferInput } from './cached-offer-figures.ts';

export interface OptionInput {
  partId: number;
  mpn: string;
  manufacturer: string;
  lifecycle: Lifecycle;
  /** 0 = chosen, then the alternates in the designer's order. */
  position: number;
  /** Verdict and review status at the current catalogue, in words with the verdict mark. */
  status: string;
  holds: boolean;
  sources: BuyingSource[];
  /** The buyer's preferred source and note for this option, if any. */
  preference: OptionPreference | null;
  /** The distributor offers cached for this part (absent: none, or not shown to this person). */
  offers?: readonly CachedOfferInput[];
}

/** A buyer's preference on one option: the source by distributor and SKU (null: cheapest), a note, who set it. */
export interface OptionPreference {
  source: { distributor: string; sku: string } | null;
  note: string | null;
  setByName: string | null;
  updatedAt: string;
}

export interface LineInput {
  /** 'motor', 'switch', 'driver', 'diode' or 'pull'. */
  key: string;
  label: string;
  perBoard: number;
  /** Catalogue options; empty for a generic line. */
  options: OptionInput[];
  /** For a generic line: what to buy, in words ("6.8 kΩ ±1 %, 0.1 W"). */
  generic: string | null;
}

export interface OptionFigures extends Omit<OptionInput, 'sources' | 'offers'> {
  stockQty: number;
  shortfall: number;
  /** The source bought from (the buyer's preferred one when it sells this part, else the cheapest in the organisation currency). */
  quote: SourceQuote | null;
  /** Whether `quote` is the buyer's preferred source; false when there is none or it is no longer listed. */
  preferredApplied: boolean;
  /** Every source, quoted at the need, for the order table. */
  quotes: SourceQuote[];
  /** The cached distributor offers at the need; shown beside the sources, not bought from nor totalled. */
  distributorOffers: CachedOfferFigures[];
}

export interface LineFigures extends Omit<LineInput, 'options'> {
  need: number;
  options: OptionFigures[];
}

export interface ShortlistTotals {
  orgCurrency: string;
  /** Sum of the chosen options' converted costs, to the cent. */
  totalOrg: number;
  /** The rates used, with their dates. */
  ratesUsed: CurrencyRate[];
  /** Lines whose chosen option could not be priced or converted (no source, below the first break, no rate), and generic lines. */
  unpriced: string[];
  /** Lines whose chosen option is short at this quantity. */
  short: string[];
}

/** The id of the listed source the preference names (same distributor and SKU), else null. */
function preferredSourceId(o: OptionInput): number | null {
  const want = o.preference?.source;
  if (!want) return null;
  return o.sources.find((s) => s.distributor === want.distributor && s.sku === want.sku)?.id ?? null;
}

function optionFigures(o: OptionInput, need: number, org: string, rates: readonly CurrencyRate[]): OptionFigures {
  const { sources, offers = [], ...rest } = o;
  const quotes = sources.map((s) => quoteSource(s, need, org, rates));
  const stockQty = sources.reduce((sum, s) => sum + s.stockQty, 0);
  const preferred = preferredSourceId(o);
  const quote = pickSource(quotes, preferred);
  return {
    ...rest,
    stockQty,
    shortfall: shortfall(need, stockQty),
    quotes,
    quote,
    preferredApplied: preferred !== null && quote?.source.id === preferred,
    distributorOffers: offers.map((offer) => cachedOfferAtNeed(offer, need)),
  };
}

export function shortlistFigures(
  lines: readonly LineInput[],
  boards: number,
  attritionPct: number,
  orgCurrency: string,
  rates: readonly CurrencyRate[],
): { lines: LineFigures[]; totals: ShortlistTotals } {
  const out = lines.map((l) => {
    const need = quantityNeeded(l.perBoard, boards, attritionPct);
    const options = l.options.map((o) => optionFigures(o, need, orgCurrency, rates));
    return { ...l, need, options };
  });
  let total = 0;
  const used = new Map<string, CurrencyRate>();
  const unpriced: string[] = [];
  const short: string[] = [];
  for (const l of out) {
    const chosen = l.options.find((o) => o.position === 0);
    if (chosen && chosen.shortfall > 0) short.push(l.label);
    const converted = chosen?.quote?.converted;
    if (!chosen || !converted) {
      unpriced.push(l.label);
      continue;
    }
    total += converted.amount;
    const q = chosen.quote!;
    if (converted.asOf !== null)
      used.set(q.source.currency, { currency: q.source.currency, rateToOrg: converted.rateToOrg, asOf: converted.asOf });
  }
  return {
    lines: out,
    totals: {
      orgCurrency,
      totalOrg: roundMoney(total),
      ratesUsed: [...used.values()].sort((a, b) => a.currency.localeCompare(b.currency)),
      unpriced,
      short,
    },
  };
}

/** Most boards one shortlist build may be figured for. */
export const MAX_BUILD_BOARDS = 1_000_000;

/**
 * The buyer's build quantities from query parameters `boards-<designId>=<boards>`; each bad one becomes an
 * issue naming its parameter (whole boards, 1 to MAX_BUILD_BOARDS).
 */
export function buildQuantities(params: URLSearchParams): { boards: Map<number, number>; issues: { path: string; message: string }[] } {
  const boards = new Map<number, number>();
  const issues: { path: string; message: string }[] = [];
  for (const [key, raw] of params.entries()) {
    const m = /^boards-(\d{1,10})$/.exec(key);
    if (!m) continue;
    const n = Number(raw);
    if (!/^\d+$/.test(raw.trim()) || !Number.isSafeInteger(n) || n < 1 || n > MAX_BUILD_BOARDS)
      issues.push({ path: key, message: `Boards per build is a whole number from 1 to ${MAX_BUILD_BOARDS}` });
    else boards.set(Number(m[1]), n);
  }
  return { boards, issues };
}
