import { describe, expect, it } from 'vitest';
import { matchOrder } from '../../src/lib/design-match.ts';
import { bestUnitPrice } from '../../src/lib/part-summary.ts';
import type { CandidateResult } from '../../src/lib/ranking.ts';
import { mosfetPart } from './fixtures.ts';

/**
 * The match order on a hand table: ties of verdict and score go by price at the build quantity, then
 * lifecycle; with `visible`, only the tie groups holding a visible part are reordered (a page's other
 * groups sit at the same ranks whatever their inner order). Invented parts and prices.
 */
const priced = (id: number, unitPrice: number | null, lifecycle: 'active' | 'nrnd' = 'active') => ({
  ...mosfetPart(id, `INV-${id}`),
  lifecycle,
  sources: unitPrice == null ? [] : [{ moq: 1, currency: 'EUR', priceBreaks: [{ qty: 1, unitPrice }] }],
});

const entry = (id: number, verdict: 'pass' | 'fail', score: number) =>
  ({ partId: id, mpn: `INV-${id}`, verdict, score, checks: [] }) as unknown as CandidateResult;

// Engine order (verdict, score, MPN): two tie groups, pass@50 = {1, 2, 3} and fail@0 = {4, 5, 6}.
const ranked = [
  entry(1, 'pass', 50),
  entry(2, 'pass', 50),
  entry(3, 'pass', 50),
  entry(4, 'fail', 0),
  entry(5, 'fail', 0),
  entry(6, 'fail', 0),
];
const parts = new Map<number | undefined, ReturnType<typeof priced>>([
  [1, priced(1, 0.3)],
  [2, priced(2, 0.1)],
  [3, priced(3, 0.1, 'nrnd')],
  [4, priced(4, 0.9)],
  [5, priced(5, null)],
  [6, priced(6, 0.2)],
]);

describe('match order', () => {
  it('every tie group by price, then lifecycle; unpriced last', () => {
    expect(matchOrder(ranked, parts, 10).map((e) => e.partId)).toEqual([2, 3, 1, 6, 4, 5]);
  });

  it('with visible parts: only their groups are reordered, the others keep the engine order', () => {
    expect(matchOrder(ranked, parts, 10, new Set([5])).map((e) => e.partId)).toEqual([1, 2, 3, 6, 4, 5]);
    expect(matchOrder(ranked, parts, 10, new Set([1])).map((e) => e.partId)).toEqual([2, 3, 1, 4, 5, 6]);
    expect(matchOrder(ranked, parts, 10, new Set()).map((e) => e.partId)).toEqual([1, 2, 3, 4, 5, 6]);
  });
});

describe('best unit price at a quantity', () => {
  const part = {
    sources: [
      // The break at or below the quantity, or at or below the MOQ when that is more; the first of equal breaks.
      {
        moq: 1,
        currency: 'EUR',
        priceBreaks: [
          { qty: 100, unitPrice: 0.2 },
          { qty: 1, unitPrice: 0.5 },
          { qty: 10, unitPrice: 0.3 },
          { qty: 10, unitPrice: 0.29 },
        ],
      },
      {
        moq: 500,
        currency: 'USD',
        priceBreaks: [
          { qty: 500, unitPrice: 0.6 },
          { qty: 1000, unitPrice: 0.1 },
        ],
      },
    ],
  };
  it.each([
    [1, 0.5, 'EUR'],
    [9, 0.5, 'EUR'],
    [10, 0.3, 'EUR'],
    [99, 0.3, 'EUR'],
    [100, 0.2, 'EUR'],
    [1000, 0.1, 'USD'],
  ])('at %i: %f %s', (qty, price, currency) => {
    expect(bestUnitPrice(part, qty)).toEqual({ price, currency });
  });
  it('no break applies: null', () => {
    expect(bestUnitPrice({ sources: [{ moq: 1, currency: 'EUR', priceBreaks: [{ qty: 50, unitPrice: 1 }] }] }, 10)).toBeNull();
  });
});
