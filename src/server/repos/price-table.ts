/**
 * Every price break of the match candidates, packed into a few typed arrays: part → its sources (in
 * source id order) → their breaks (by quantity). The candidate cache holds all of them between matches
 * (about 120,000 sources and 430,000 breaks at 67,000 parts): as objects that was some 60 MiB of heap
 * and 550,000 objects for every garbage collection to walk; packed it is about 8 MiB. A part's sources
 * come back as plain objects when asked for (a match prices a few dozen to a few tens of thousands).
 */

import type { PriceSource } from '../../lib/domain/parts.ts';

/** One source of a part: its MOQ, currency and price breaks (ascending quantity). */
export interface SourceBreaks {
  moq: number;
  currency: string;
  breaks: { qty: number; unitPrice: number }[];
}

export class PriceTable {
  /** Part id → index of its first source in `sourceStart`'s numbering (its sources run to the next part's). */
  private readonly partIndex: Map<number, number>;
  private readonly partSourceStart: Int32Array;
  private readonly moq: Float64Array;
  private readonly currencyIndex: Uint16Array;
  private readonly breakStart: Int32Array;
  private readonly qty: Float64Array;
  private readonly unitPrice: Float64Array;
  private readonly currencies: string[];

  /** `sourcesByPart`: each part's sources in their order, each with its breaks in theirs. */
  constructor(sourcesByPart: ReadonlyMap<number, readonly SourceBreaks[]>) {
    let sourceCount = 0;
    let breakCount = 0;
    for (const list of sourcesByPart.values()) {
      sourceCount += list.length;
      for (const s of list) breakCount += s.breaks.length;
    }
    this.partIndex = new Map();
    this.partSourceStart = new Int32Array(sourcesByPart.size + 1);
    this.moq = new Float64Array(sourceCount);
    this.currencyIndex = new Uint16Array(sourceCount);
    this.breakStart = new Int32Array(sourceCount + 1);
    this.qty = new Float64Array(breakCount);
    this.unitPrice = new Float64Array(breakCount);
    this.currencies = [];
    const currencyOf = new Map<string, number>();
    let p = 0;
    let s = 0;
    let b = 0;
    for (const [partId, list] of sourcesByPart) {
      this.partIndex.set(partId, p);
      this.partSourceStart[p++] = s;
      for (const source of list) {
        let c = currencyOf.get(source.currency);
        if (c === undefined) {
          c = this.currencies.push(source.currency) - 1;
          if (c > 0xffff) throw new Error('more currencies than a price table holds');
          currencyOf.set(source.currency, c);
        }
        this.moq[s] = source.moq;
        this.currencyIndex[s] = c;
        this.breakStart[s++] = b;
        for (const br of source.breaks) {
          this.qty[b] = br.qty;
          this.unitPrice[b++] = br.unitPrice;
        }
      }
    }
    this.partSourceStart[p] = s;
    this.breakStart[s] = b;
  }

  /** Parts with at least one source. */
  get size(): number {
    return this.partIndex.size;
  }

  has(partId: number): boolean {
    return this.partIndex.has(partId);
  }

  /**
   * Per source only the price break that applies at `qty`: the largest at or below the quantity or the
   * source's MOQ, whichever is higher; a source without one is left out (as priceSourcesOf in SQL and
   * sourcesAt on the objects). Undefined when the part has no source with a break that applies.
   */
  at(partId: number, qty: number): PriceSource[] | undefined {
    const p = this.partIndex.get(partId);
    if (p === undefined) return undefined;
    let out: PriceSource[] | undefined;
    for (let s = this.partSourceStart[p]; s < this.partSourceStart[p + 1]; s++) {
      const limit = Math.max(qty, this.moq[s]);
      let best = -1;
      for (let b = this.breakStart[s]; b < this.breakStart[s + 1]; b++)
        if (this.qty[b] <= limit && (best < 0 || this.qty[b] > this.qty[best])) best = b;
      if (best < 0) continue;
      (out ??= []).push({
        moq: this.moq[s],
        currency: this.currencies[this.currencyIndex[s]],
        priceBreaks: [{ qty: this.qty[best], unitPrice: this.unitPrice[best] }],
      });
    }
    return out;
  }

  /** The part's sources as objects (undefined for a part without any), as they were given. */
  get(partId: number): SourceBreaks[] | undefined {
    const p = this.partIndex.get(partId);
    if (p === undefined) return undefined;
    const out: SourceBreaks[] = [];
    for (let s = this.partSourceStart[p]; s < this.partSourceStart[p + 1]; s++) {
      const breaks: SourceBreaks['breaks'] = [];
      for (let b = this.breakStart[s]; b < this.breakStart[s + 1]; b++) breaks.push({ qty: this.qty[b], unitPrice: this.unitPrice[b] });
      out.push({ moq: this.moq[s], currency: this.currencies[this.currencyIndex[s]], breaks });
    }
    return out;
  }
}
