import { describe, expect, it } from 'vitest';
import { PriceTable, type SourceBreaks } from '../../src/server/repos/price-table.ts';

// Invented sources (demo-style figures): two parts, one with two sources in two currencies, one with one.
const sources = new Map<number, SourceBreaks[]>([
  [
    17,
    [
      {
        moq: 1,
        currency: 'EUR',
        breaks: [
          { qty: 1, unitPrice: 0.42 },
          { qty: 100, unitPrice: 0.31 },
          { qty: 1000, unitPrice: 0.225 },
        ],
      },
      { moq: 2500, currency: 'USD', breaks: [{ qty: 2500, unitPrice: 0.19 }] },
    ],
  ],
  [4, [{ moq: 10, currency: 'EUR', breaks: [{ qty: 10, unitPrice: 1.05 }] }]],
]);

describe('PriceTable: price breaks packed, given back as they were', () => {
  const table = new PriceTable(sources);
  // The USD source's one break is at its 2,500 MOQ: it applies at any quantity.
  const usdAtMoq = [{ moq: 2500, currency: 'USD', priceBreaks: [{ qty: 2500, unitPrice: 0.19 }] }];

  it('gives each part its sources and breaks in their order, currencies included', () => {
    expect(table.get(17)).toEqual(sources.get(17));
    expect(table.get(4)).toEqual(sources.get(4));
  });

  it('knows which parts have sources', () => {
    expect(table.size).toBe(2);
    expect(table.has(17)).toBe(true);
    expect(table.has(5)).toBe(false);
    expect(table.get(5)).toBeUndefined();
  });

  it('hands out fresh objects: changing one does not change the table', () => {
    const first = table.get(4)!;
    first[0].breaks[0].unitPrice = 99;
    expect(table.get(4)![0].breaks[0].unitPrice).toBe(1.05);
  });

  it('prices each source at the break for the quantity: the largest at or below max(quantity, MOQ)', () => {
    // Hand-worked from the table above.
    expect(table.at(17, 1)).toEqual([{ moq: 1, currency: 'EUR', priceBreaks: [{ qty: 1, unitPrice: 0.42 }] }, ...usdAtMoq]);
    expect(table.at(17, 250)).toEqual([{ moq: 1, currency: 'EUR', priceBreaks: [{ qty: 100, unitPrice: 0.31 }] }, ...usdAtMoq]);
    expect(table.at(17, 5000)).toEqual([{ moq: 1, currency: 'EUR', priceBreaks: [{ qty: 1000, unitPrice: 0.225 }] }, ...usdAtMoq]);
    // Below the MOQ the MOQ's break applies (the buyer must take the MOQ).
    expect(table.at(4, 1)).toEqual([{ moq: 10, currency: 'EUR', priceBreaks: [{ qty: 10, unitPrice: 1.05 }] }]);
    expect(table.at(5, 1)).toBeUndefined();
  });

  it('leaves out a source whose every break lies above max(quantity, MOQ)', () => {
    const odd = new PriceTable(new Map([[9, [{ moq: 1, currency: 'EUR', breaks: [{ qty: 50, unitPrice: 0.5 }] }]]]));
    expect(odd.at(9, 10)).toBeUndefined();
    expect(odd.at(9, 50)).toEqual([{ moq: 1, currency: 'EUR', priceBreaks: [{ qty: 50, unitPrice: 0.5 }] }]);
  });

  it('an empty table has no parts', () => {
    const empty = new PriceTable(new Map());
    expect(empty.size).toBe(0);
    expect(empty.get(1)).toBeUndefined();
  });
});
