/**
 * A cached distributor offer at a shortlist need, and its words with the age of the figure. Expected
 * values are worked out by hand beside each row; the rules (order at least the MOQ, the highest break at
 * or below the order quantity, money to the cent) are common practice.
 */
import { describe, expect, it } from 'vitest';
import { cachedOfferAtNeed, cachedOfferWords, type CachedOfferInput } from '../../src/lib/cached-offer-figures.ts';

const FETCHED = '2026-12-03T09:00:00.000Z';
const offer: CachedOfferInput = {
  distributor: 'Invented Parts Depot',
  sku: 'IPD-77',
  stockQty: 300,
  moq: 10,
  currency: 'EUR',
  priceBreaks: [
    { qty: 1, unitPrice: 0.31 },
    { qty: 100, unitPrice: 0.25 },
    { qty: 1000, unitPrice: 0.19 },
  ],
  leadTimeDays: 2,
  fetchedAt: FETCHED,
  checkedAt: FETCHED,
  lastError: null,
  stale: false,
};

describe('cachedOfferAtNeed', () => {
  it.each([
    // need → order (MOQ 10), break, unit, extended, shortfall against 300 in stock
    ['5: raised to the MOQ, first break', 5, 10, 1, 0.31, 3.1, 0], // 10 × 0.31 = 3.10
    ['510: the 100 break', 510, 510, 100, 0.25, 127.5, 210], // 510 × 0.25 = 127.50; 510 − 300
    ['1200: the 1000 break', 1200, 1200, 1000, 0.19, 228, 900], // 1200 × 0.19 = 228.00; 1200 − 300
    ['300: exactly the stock', 300, 300, 100, 0.25, 75, 0], // 300 × 0.25 = 75.00
  ])('%s', (_name, need, orderQty, breakQty, unitPrice, ext, short) => {
    const f = cachedOfferAtNeed(offer, need);
    expect([f.orderQty, f.breakQty, f.unitPrice, f.extendedCost, f.shortfall]).toEqual([orderQty, breakQty, unitPrice, ext, short]);
  });

  it('leaves the price empty below the first break (breaks from 100, need 20)', () => {
    const f = cachedOfferAtNeed({ ...offer, moq: 1, priceBreaks: [{ qty: 100, unitPrice: 0.2 }] }, 20);
    expect([f.orderQty, f.breakQty, f.unitPrice, f.extendedCost]).toEqual([20, null, null, null]);
  });
});

describe('cachedOfferWords', () => {
  const at = (iso: string): number => Date.parse(iso);
  it.each([
    [
      'fresh, short: fetched 3 h 5 min before',
      offer,
      510,
      '2026-12-03T12:05:00.000Z',
      '✕ 300 in stock, short by 210 · 0.2500 EUR at 100+ (127.50 EUR for 510) · lead 2 d · MOQ 10',
      'fetched 3 h ago',
      null,
    ],
    [
      'enough stock, 1,000s separated, no lead time stated',
      { ...offer, stockQty: 12_400, moq: 1, leadTimeDays: null },
      1200,
      '2026-12-03T09:00:30.000Z',
      '✓ 12,400 in stock · 0.1900 EUR at 1,000+ (228.00 EUR for 1,200) · lead time not stated',
      'fetched just now',
      null,
    ],
    [
      'last fetch failed 12 min ago: the figure kept, said so',
      { ...offer, checkedAt: '2026-12-03T11:53:00.000Z', lastError: 'answered 500 (4 attempts)', stale: true },
      5,
      '2026-12-03T12:05:00.000Z',
      '✓ 300 in stock · 0.3100 EUR at 1+ (3.10 EUR for 10) · lead 2 d · MOQ 10',
      'fetched 3 h ago',
      'Last fetch failed 12 min ago (answered 500 (4 attempts)); the figure fetched 3 h ago is kept.',
    ],
    [
      'old without an error',
      { ...offer, stale: true },
      5,
      '2026-12-06T10:00:00.000Z',
      '✓ 300 in stock · 0.3100 EUR at 1+ (3.10 EUR for 10) · lead 2 d · MOQ 10',
      'fetched 3 days ago',
      'Not refreshed lately; the figure fetched 3 days ago is kept.',
    ],
  ])('%s', (_name, input, need, now, figure, age, warning) => {
    const w = cachedOfferWords(cachedOfferAtNeed(input, need), at(now));
    expect(w).toEqual({ source: `${input.distributor} ${input.sku}`, figure, enough: !figure.startsWith('✕'), age, warning });
  });
});
