/**
 * The buyer's arithmetic. Every expected value is worked out by hand in the comment beside it (not by the
 * code under test); the rounding rules (round the need up to whole parts, raise to the MOQ, then to whole
 * order multiples, take the highest price break at or below the quantity) are common practice.
 */
import { describe, expect, it } from 'vitest';
import {
  convertToOrg,
  extendedCost,
  orderQuantity,
  pickSource,
  quantityNeeded,
  quoteSource,
  roundMoney,
  shortfall,
  unitPriceAt,
  type BuyingSource,
  type CurrencyRate,
} from '../../src/lib/buying.ts';

describe('quantityNeeded = ceil(per board × boards × (1 + attrition))', () => {
  it.each([
    [1, 500, 0, 500], // 1 × 500 × 1.00 = 500
    [1, 500, 2, 510], // 1 × 500 × 1.02 = 510 exactly
    [2, 500, 2.5, 1025], // 2 × 500 × 1.025 = 1025
    [1, 100, 10, 110], // 100 × 1.10 = 110 (binary 110.00000000000001 must not become 111)
    [1, 7, 10, 8], // 7 × 1.10 = 7.7 → 8
    [3, 33, 1, 100], // 99 × 1.01 = 99.99 → 100
    [1, 1, 0, 1], // one board, no spares
    [4, 250, 0.4, 1004], // 1000 × 1.004 = 1004
    [0, 500, 5, 0], // a line not fitted needs none
  ])('%d per board × %d boards + %d %% → %d', (perBoard, boards, pct, expected) => {
    expect(quantityNeeded(perBoard, boards, pct)).toBe(expected);
  });
});

describe('orderQuantity: raised to the MOQ, then to whole order multiples', () => {
  it.each([
    [510, 1, 1, 510], // no MOQ, no multiple
    [510, 1000, 1, 1000], // below the MOQ: buy the MOQ
    [510, 1, 250, 750], // 510 / 250 = 2.04 → 3 reels of 250
    [500, 1, 250, 500], // exactly 2 reels
    [510, 1000, 3000, 3000], // MOQ 1000, then one reel of 3000
    [1001, 1000, 100, 1100], // 1001 → 11 packs of 100
    [90, 100, 30, 120], // MOQ 100 is not a multiple of 30: 100 / 30 = 3.33 → 4 × 30 = 120
    [0, 1000, 100, 0], // nothing needed, nothing ordered
  ])('need %d, MOQ %d, multiple %d → %d', (need, moq, multiple, expected) => {
    expect(orderQuantity(need, moq, multiple)).toBe(expected);
  });
});

describe('unitPriceAt: the highest break at or below the quantity', () => {
  const breaks = [
    { qty: 1, unitPrice: 0.42 },
    { qty: 100, unitPrice: 0.31 },
    { qty: 1000, unitPrice: 0.22 },
  ];
  it.each([
    [1, 0.42], // first break
    [99, 0.42], // just under 100
    [100, 0.31], // exactly on the break
    [510, 0.31], // between 100 and 1000
    [1000, 0.22],
    [25000, 0.22], // above the last break
  ])('at %d → %d', (qty, price) => {
    expect(unitPriceAt(breaks, qty)?.unitPrice).toBe(price);
  });
  it('has no price below the first break, and the break order does not matter', () => {
    expect(unitPriceAt([{ qty: 10, unitPrice: 1 }], 9)).toBeNull();
    expect(unitPriceAt([...breaks].reverse(), 510)).toEqual({ qty: 100, unitPrice: 0.31 });
  });
});

describe('money to the cent', () => {
  it.each([
    [510, 0.31, 158.1], // 510 × 0.31 = 158.10
    [750, 0.0123, 9.23], // 750 × 0.0123 = 9.225 → 9.23 (half up)
    [3000, 0.0845, 253.5], // 3000 × 0.0845 = 253.50
    [1, 1.005, 1.01], // 1.005 is 1.00499… in binary; to the cent it is 1.01
    [1025, 1.35, 1383.75], // 1025 × 1.35 = 1383.75
  ])('%d × %d = %d', (qty, price, expected) => {
    expect(extendedCost(qty, price)).toBe(expected);
  });
  it('rounds negative amounts away from zero too', () => {
    expect(roundMoney(-2.345)).toBe(-2.35); // −2.345 → −2.35
  });
});

describe('convertToOrg with a rate table', () => {
  const rates: CurrencyRate[] = [
    { currency: 'USD', rateToOrg: 0.92, asOf: '2026-11-30' },
    { currency: 'GBP', rateToOrg: 1.17, asOf: '2026-11-28' },
  ];
  it.each([
    [158.1, 'USD', 145.45, 0.92, '2026-11-30'], // 158.10 × 0.92 = 145.452 → 145.45
    [253.5, 'GBP', 296.6, 1.17, '2026-11-28'], // 253.50 × 1.17 = 296.595 → 296.60
    [9.23, 'EUR', 9.23, 1, null], // already in the organisation's currency
    [100, 'usd', 92, 0.92, '2026-11-30'], // currency codes compare without case
  ])('%d %s → %d EUR', (amount, currency, expected, rate, asOf) => {
    expect(convertToOrg(amount, currency, 'EUR', rates)).toEqual({ amount: expected, rateToOrg: rate, asOf });
  });
  it('gives null for a currency without a rate (never a silent 1:1)', () => {
    expect(convertToOrg(10, 'JPY', 'EUR', rates)).toBeNull();
  });
});

describe('shortfall = need − stock when positive', () => {
  it.each([
    [510, 0, 510], // nothing in stock
    [510, 200, 310],
    [510, 510, 0], // exactly enough
    [510, 4000, 0], // plenty
  ])('need %d, stock %d → %d', (need, stock, expected) => {
    expect(shortfall(need, stock)).toBe(expected);
  });
});

describe('quoteSource and pickSource', () => {
  const rates: CurrencyRate[] = [{ currency: 'USD', rateToOrg: 0.92, asOf: '2026-11-30' }];
  const eur: BuyingSource = {
    id: 1,
    distributor: 'Invented Parts Depot',
    sku: 'IPD-1',
    moq: 1,
    orderMultiple: 1,
    stockQty: 200,
    leadTimeDays: 35,
    currency: 'EUR',
    priceBreaks: [
      { qty: 1, unitPrice: 0.4 },
      { qty: 500, unitPrice: 0.3 },
    ],
  };
  const usd: BuyingSource = {
    id: 2,
    distributor: 'Invented Reel Supply',
    sku: 'IRS-1',
    moq: 1000,
    orderMultiple: 1000,
    stockQty: 9000,
    leadTimeDays: 10,
    currency: 'USD',
    priceBreaks: [
      { qty: 1000, unitPrice: 0.25 },
      { qty: 5000, unitPrice: 0.2 },
    ],
  };

  it('prices each source at its own order quantity', () => {
    // EUR: need 510 → order 510, break 500 at 0.30 → 153.00 EUR.
    expect(quoteSource(eur, 510, 'EUR', rates)).toMatchObject({
      orderQty: 510,
      breakQty: 500,
      unitPrice: 0.3,
      extendedCost: 153,
      converted: { amount: 153, asOf: null },
    });
    // USD: need 510 → MOQ 1000 → one reel of 1000, break 1000 at 0.25 → 250.00 USD × 0.92 = 230.00 EUR.
    expect(quoteSource(usd, 510, 'EUR', rates)).toMatchObject({
      orderQty: 1000,
      breakQty: 1000,
      unitPrice: 0.25,
      extendedCost: 250,
      converted: { amount: 230, asOf: '2026-11-30' },
    });
  });

  it('picks the lowest cost in the organisation currency, unless the buyer prefers a source', () => {
    const quotes = [quoteSource(usd, 510, 'EUR', rates), quoteSource(eur, 510, 'EUR', rates)];
    expect(pickSource(quotes)?.source.id).toBe(1); // 153.00 EUR < 230.00 EUR
    expect(pickSource(quotes, 2)?.source.id).toBe(2); // the buyer's choice stands
    expect(pickSource(quotes, 99)?.source.id).toBe(1); // a preference for a source no longer listed falls back
    expect(pickSource([])).toBeNull();
  });

  it('puts a source without a rate after every priced one', () => {
    // 1000 at 0.25 = 250.00 USD might beat 1000 at 0.30 = 300.00 EUR, but with no USD rate it cannot be compared.
    const quotes = [quoteSource(usd, 1000, 'EUR', []), quoteSource(eur, 1000, 'EUR', [])];
    expect(quotes[0].converted).toBeNull();
    expect(pickSource(quotes)?.source.id).toBe(1);
  });
});
