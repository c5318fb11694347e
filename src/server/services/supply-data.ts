/** What the supply-data form needs beyond the part: the currencies it offers first. */
import type { Part } from '../../lib/domain/parts.ts';
import { currencyRates } from './currency-rates.ts';

/**
 * The organisation's currency, then the currencies the rates table converts, then any the part's sources
 * already use: the form offers these, and the schema accepts any other ISO 4217 code too.
 */
export async function supplyCurrencies(part: Part): Promise<string[]> {
  const { orgCurrency, rates } = await currencyRates();
  return [...new Set([orgCurrency, ...rates.map((r) => r.currency), ...part.sources.map((s) => s.currency)])];
}
