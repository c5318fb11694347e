/**
 * The supply-data schema shared by the part page's form and PUT /api/parts/:id/sources: each refusal names
 * its field. Column limits from the migrations (INT UNSIGNED max 4 294 967 295, DECIMAL(12,5)); the
 * ISO 4217 examples (EUR, USD, GBP valid; "EUO" not a code) are common practice.
 */
import { describe, expect, it } from 'vitest';
import { sourcesUpdateSchema } from '../../src/lib/schemas/parts.ts';
import { issuesOf } from '../../src/lib/schemas/issues.ts';

const source = (patch: Record<string, unknown> = {}) => ({
  distributor: 'Fenwick Row Electronics',
  sku: 'FRE-1',
  moq: 1,
  orderMultiple: 1,
  leadTimeDays: 5,
  stockQty: 200,
  currency: 'EUR',
  priceBreaks: [
    { qty: 1, unitPrice: 0.3 },
    { qty: 100, unitPrice: 0.25 },
  ],
  ...patch,
});
const paths = (sources: unknown[]): string[] => {
  const r = sourcesUpdateSchema.safeParse({ sources, version: 1 });
  return r.success ? [] : issuesOf(r.error).map((i) => i.path);
};

describe('supply-data schema', () => {
  it('a plain source with two ascending breaks passes', () => {
    expect(paths([source()])).toEqual([]);
  });

  it.each<[string, unknown[], string]>([
    [
      'breaks out of order',
      [
        source(),
        source({
          sku: 'FRE-2',
          priceBreaks: [
            { qty: 100, unitPrice: 0.2 },
            { qty: 10, unitPrice: 0.3 },
          ],
        }),
      ],
      'sources.1.priceBreaks.1.qty',
    ],
    [
      'two breaks at one quantity',
      [
        source({
          priceBreaks: [
            { qty: 10, unitPrice: 0.2 },
            { qty: 10, unitPrice: 0.3 },
          ],
        }),
      ],
      'sources.0.priceBreaks.1.qty',
    ],
    ['a zero price', [source({ priceBreaks: [{ qty: 1, unitPrice: 0 }] })], 'sources.0.priceBreaks.0.unitPrice'],
    ['a negative price', [source({ priceBreaks: [{ qty: 1, unitPrice: -0.1 }] })], 'sources.0.priceBreaks.0.unitPrice'],
    ['a price past DECIMAL(12,5)', [source({ priceBreaks: [{ qty: 1, unitPrice: 1e7 }] })], 'sources.0.priceBreaks.0.unitPrice'],
    [
      'a sixth decimal DECIMAL(12,5) cannot keep',
      [source({ priceBreaks: [{ qty: 1, unitPrice: 0.123456 }] })],
      'sources.0.priceBreaks.0.unitPrice',
    ],
    ['a fractional break quantity', [source({ priceBreaks: [{ qty: 2.5, unitPrice: 0.1 }] })], 'sources.0.priceBreaks.0.qty'],
    ['MOQ above the first break', [source({ moq: 500 })], 'sources.0.moq'],
    ['order multiple 0', [source({ orderMultiple: 0 })], 'sources.0.orderMultiple'],
    ['a currency that is not ISO 4217', [source({ currency: 'EUO' })], 'sources.0.currency'],
    ['a lower-case currency', [source({ currency: 'eur' })], 'sources.0.currency'],
    ['stock past INT UNSIGNED', [source({ stockQty: 4_294_967_296 })], 'sources.0.stockQty'],
    ['fractional stock', [source({ stockQty: 1.5 })], 'sources.0.stockQty'],
    ['negative lead time', [source({ leadTimeDays: -1 })], 'sources.0.leadTimeDays'],
    ['fractional lead time', [source({ leadTimeDays: 2.5 })], 'sources.0.leadTimeDays'],
    ['the same distributor and SKU twice', [source(), source()], 'sources.1.sku'],
  ])('%s is refused at its field', (_name, sources, path) => {
    expect(paths(sources)).toEqual([path]);
  });

  it('the MOQ refusal explains itself', () => {
    const r = sourcesUpdateSchema.safeParse({ sources: [source({ moq: 500 })], version: 1 });
    expect(r.success).toBe(false);
    expect(issuesOf(r.error!)[0].message).toContain('MOQ 500 is above the first price break (1)');
  });
});
