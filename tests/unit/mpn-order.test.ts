import { describe, expect, it } from 'vitest';
import { sortCandidates, type CandidateResult } from '../../src/lib/ranking.ts';

/**
 * The ranking orders ties by part number in the default collation. Lists of plain part numbers (digits,
 * capitals, hyphens) are compared by code unit when that gives the same order; these checks hold the
 * fast order to the platform's own collator (Intl.Collator, a second method) and to a hand table.
 */
const collator = new Intl.Collator().compare;

/** A small deterministic generator (LCG, Numerical Recipes constants) so a failure can be replayed. */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

function randomMpns(n: number, alphabet: string, seed: number): string[] {
  const next = lcg(seed);
  return Array.from({ length: n }, () => {
    const len = 1 + Math.floor(next() * 9);
    let s = '';
    for (let i = 0; i < len; i++) s += alphabet[Math.floor(next() * alphabet.length)];
    return s;
  });
}

const asResults = (mpns: string[]): CandidateResult[] =>
  mpns.map((mpn, i) => ({ partId: i + 1, mpn, verdict: 'fail', score: 0, checks: [] }) as unknown as CandidateResult);

describe('part-number order of tied candidates', () => {
  it('plain part numbers: the same order as the collator (5,000 random, hyphens, digits and capitals)', () => {
    const mpns = randomMpns(5_000, '-0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZ', 1);
    const sorted = sortCandidates(asResults(mpns)).map((r) => r.mpn);
    expect(sorted).toEqual([...mpns].sort(collator));
  });

  it('a list with lower case, dots and slashes falls back to the collator, whose order differs from code units', () => {
    const mpns = [...randomMpns(2_000, '-0123456789ABCXYZ', 2), 'ab-1', 'AB-1', 'A.1', 'A/1', 'a1', 'A_1'];
    const sorted = sortCandidates(asResults(mpns)).map((r) => r.mpn);
    expect(sorted).toEqual([...mpns].sort(collator));
    // The reason for the fallback: by code unit every capital sorts before every lower-case letter.
    expect(['a1', 'B1'].sort()).toEqual(['B1', 'a1']);
    expect(['a1', 'B1'].sort(collator)).toEqual(['a1', 'B1']);
  });

  it('hand table: hyphen before digits before letters, a prefix before its extensions', () => {
    // Unicode Collation Algorithm (UTS #10), default table: punctuation, then digits, then letters at the
    // first level (from memory; the collator check above confirms it on this platform).
    const expected = ['A', 'A-1', 'A-B', 'A0', 'A1', 'A10', 'A2', 'AB', 'B', 'Z9'];
    const shuffled = ['Z9', 'A10', 'AB', 'A-B', 'A', 'B', 'A2', 'A-1', 'A1', 'A0'];
    expect(sortCandidates(asResults(shuffled)).map((r) => r.mpn)).toEqual(expected);
  });
});
