/**
 * The shortlist figures with a buyer's preference, and the CSV rows made from them. Expected values are
 * worked out by hand beside each check; the rounding rules (need up to whole parts, MOQ then whole order
 * multiples, highest break at or below the quantity, money to the cent) are common practice.
 */
import { describe, expect, it } from 'vitest';
import { shortlistFigures, type LineInput, type OptionInput } from '../../src/lib/shortlist-figures.ts';
import { shortlistCsv, SHORTLIST_CSV_HEADER } from '../../src/lib/shortlist-csv.ts';
import { readCsvRecords } from '../../src/lib/csv.ts';
import type { BuyingSource, CurrencyRate } from '../../src/lib/buying.ts';

const RATES: CurrencyRate[] = [{ currency: 'USD', rateToOrg: 0.9, asOf: '2026-11-30' }];
const strip: BuyingSource = {
  id: 11,
  distributor: 'Strip Co',
  sku: 'S-1',
  moq: 1,
  orderMultiple: 10,
  stockQty: 100,
  leadTimeDays: 4,
  currency: 'EUR',
  priceBreaks: [{ qty: 1, unitPrice: 0.5 }],
};
const reel: BuyingSource = {
  id: 12,
  distributor: 'Reel Co',
  sku: 'R-1',
  moq: 500,
  orderMultiple: 500,
  stockQty: 0,
  leadTimeDays: 30,
  currency: 'USD',
  priceBreaks: [{ qty: 500, unitPrice: 0.3 }],
};
const option = (preference: OptionInput['preference']): OptionInput => ({
  partId: 7,
  mpn: 'INV-Q1',
  manufacturer: 'Invented Semis',
  lifecycle: 'active',
  position: 0,
  status: '✓ Pass',
  holds: true,
  sources: [strip, reel],
  preference,
});
const line = (preference: OptionInput['preference']): LineInput => ({
  key: 'switch',
  label: 'Low-side switch',
  perBoard: 1,
  generic: null,
  options: [option(preference)],
});
const pref = (source: { distributor: string; sku: string } | null, note: string | null) => ({
  source,
  note,
  setByName: 'B. Buyer',
  updatedAt: '2026-12-03T10:00:00.000Z',
});

describe('the preferred source on a shortlist option (200 boards, 5 % spares: need 210)', () => {
  it.each([
    // Strip: 210 → 21 strips = 210 × 0.50 = 105.00 EUR. Reel: 210 → MOQ 500 × 0.30 = 150.00 USD × 0.9 = 135.00 EUR.
    ['no preference: the cheapest (strip)', null, 'S-1', 105, false],
    ['the reel preferred: bought from it though dearer', pref({ distributor: 'Reel Co', sku: 'R-1' }, null), 'R-1', 135, true],
    ['a preferred source no longer listed: the cheapest', pref({ distributor: 'Gone Co', sku: 'G-1' }, null), 'S-1', 105, false],
    ['a note alone: the cheapest', pref(null, 'call first'), 'S-1', 105, false],
  ] as const)('%s', (_name, p, sku, total, applied) => {
    const { lines, totals } = shortlistFigures([line(p)], 200, 5, 'EUR', RATES);
    const o = lines[0].options[0];
    expect(lines[0].need).toBe(210); // 200 × 1.05
    expect([o.quote?.source.sku, o.preferredApplied, totals.totalOrg]).toEqual([sku, applied, total]);
    expect(o.shortfall).toBe(110); // 210 − 100
  });
});

describe('the shortlist CSV rows', () => {
  const { lines, totals } = shortlistFigures([line(pref({ distributor: 'Reel Co', sku: 'R-1' }, '+1 spare reel'))], 200, 5, 'EUR', RATES);
  const { csv, rows } = shortlistCsv([{ id: 3, name: 'Fan', revision: 2, boards: 200, attritionPct: 5, lines, totals }]);
  const records = readCsvRecords(csv).map((r) => r.cells);
  const byName = (cells: string[]) => Object.fromEntries(SHORTLIST_CSV_HEADER.map((h, i) => [h, cells[i]]));

  it('writes the header, one line row, the total, the short line and the rate used', () => {
    expect(records[0]).toEqual([...SHORTLIST_CSV_HEADER]);
    expect(records.slice(1).map((r) => r[0])).toEqual(['line', 'total', 'short', 'rate']);
    expect(rows).toBe(4);
  });

  it('puts the hand figures in the line row and neutralises the formula-leading note', () => {
    const r = byName(records[1]);
    // Reel: 500 × 0.30 = 150.00 USD × 0.9 = 135.00 EUR; stock 100, short by 110.
    expect([r.need, r.sku, r.preferred_by, r.order_qty, r.unit_price, r.extended, r.converted, r.stock, r.shortfall]).toEqual([
      '210',
      'R-1',
      'B. Buyer',
      '500',
      '0.3',
      '150.00',
      '135.00',
      '100',
      '110',
    ]);
    expect(r.note).toBe("'+1 spare reel"); // OWASP CSV injection: a leading + is guarded with an apostrophe
  });

  it('gives the total in the organisation currency and the rate with its date', () => {
    expect([byName(records[2]).converted, byName(records[2]).org_currency]).toEqual(['135.00', 'EUR']);
    expect([byName(records[3]).line, byName(records[3]).check]).toEqual(['Low-side switch', 'short at 200 boards']);
    expect([byName(records[4]).currency, byName(records[4]).unit_price, byName(records[4]).note]).toEqual([
      'USD',
      '0.9',
      'rate of 2026-11-30',
    ]);
  });
});

describe('a cached distributor offer in the shortlist CSV', () => {
  const cached = {
    distributor: 'Invented Parts Depot',
    sku: 'IPD-77',
    stockQty: 150,
    moq: 10,
    currency: 'EUR',
    priceBreaks: [
      { qty: 1, unitPrice: 0.31 },
      { qty: 100, unitPrice: 0.25 },
    ],
    leadTimeDays: 2,
    fetchedAt: '2026-12-03T09:00:00.000Z',
    checkedAt: '2026-12-03T11:53:00.000Z',
    lastError: 'answered 500 (4 attempts)',
    stale: true,
  };
  const withOffer: LineInput = { ...line(null), options: [{ ...option(null), offers: [cached] }] };
  const { lines, totals } = shortlistFigures([withOffer], 200, 5, 'EUR', RATES);
  const records = readCsvRecords(shortlistCsv([{ id: 3, name: 'Fan', revision: 2, boards: 200, attritionPct: 5, lines, totals }]).csv).map(
    (r) => r.cells,
  );
  const byName = (cells: string[]) => Object.fromEntries(SHORTLIST_CSV_HEADER.map((h, i) => [h, cells[i]]));

  it('follows its option as an "offer" row with the figure at the need, when it was fetched and the last error', () => {
    // No rate row: without a preference the EUR strip is bought, so no USD amount is converted.
    expect(records.slice(1).map((r) => r[0])).toEqual(['line', 'offer', 'total', 'short']);
    const r = byName(records[2]);
    // Need 210 (200 × 1.05) ≥ MOQ 10: 210 at the 100 break, 210 × 0.25 = 52.50 EUR; 210 − 150 = 60 short.
    expect([r.option, r.part_number, r.need, r.sku, r.order_qty, r.break_qty, r.unit_price, r.extended, r.stock, r.shortfall]).toEqual([
      'chosen',
      'INV-Q1',
      '210',
      'IPD-77',
      '210',
      '100',
      '0.25',
      '52.50',
      '150',
      '60',
    ]);
    expect([r.lead_time_days, r.moq, r.converted, r.fetched_at, r.fetch_error]).toEqual([
      '2',
      '10',
      '',
      '2026-12-03T09:00:00.000Z',
      'answered 500 (4 attempts)',
    ]);
  });

  it('leaves the total to the catalogue sources (the offer is not bought from)', () => {
    // Strip: 210 × 0.50 = 105.00 EUR, as in the first table above.
    expect(byName(records[3]).converted).toBe('105.00');
  });
});
