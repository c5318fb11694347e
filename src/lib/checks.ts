/**
 * The shape every engineering check returns, and the verdict rule that reads them.
 */
import { sig } from './units.ts';

export type Verdict = 'pass' | 'marginal' | 'fail';

export interface Check {
  /** Stable identifier, e.g. 'drain-voltage'. */
  id: string;
  /** True when the check holds with its default margin. */
  ok: boolean;
  value: number | null;
  limit: number | null;
  unit: string;
  /** Headroom as a fraction of the limit (negative when exceeded), or null when not meaningful. */
  margin: number | null;
  /** A sentence a person can act on. */
  note: string;
  /** Present only when ok is false: 'hard' breaks a rating, 'margin' eats into the default margin. */
  severity?: 'hard' | 'margin';
}

/** fail if any hard limit fails; marginal if hard limits hold but a margin is short; else pass. */
export function verdictOf(checks: readonly Check[]): Verdict {
  if (checks.some((c) => !c.ok && c.severity !== 'margin')) return 'fail';
  if (checks.some((c) => !c.ok)) return 'marginal';
  return 'pass';
}

export const VERDICT_RANK: Readonly<Record<Verdict, number>> = { pass: 0, marginal: 1, fail: 2 };

/** Headroom of a value that must stay at or below its limit. */
export function marginBelow(value: number, limit: number): number | null {
  return limit !== 0 && Number.isFinite(value) && Number.isFinite(limit) ? (limit - value) / Math.abs(limit) : null;
}

/** Headroom of a value that must reach at least its limit. */
export function marginAbove(value: number, limit: number): number | null {
  return limit !== 0 && Number.isFinite(value) && Number.isFinite(limit) ? (value - limit) / Math.abs(limit) : null;
}

/** Builds a check from a fresh object literal (it becomes the check); severity is set only on failures. */
export function makeCheck(fields: Omit<Check, 'severity'>, failSeverity: 'hard' | 'margin' = 'hard'): Check {
  if (!fields.ok) (fields as Check).severity = failSeverity;
  return fields;
}

/** False while a ranking judges candidates it only counts (withoutNotes): their notes are never read. */
let notesWanted = true;

/**
 * Runs `fn` with every check note's numbers left out (fmt gives ''): the verdicts, values, limits and
 * margins are the same, only the sentences are not worked out. A match judges tens of thousands of
 * candidates and shows a page of them; the page's entries are judged again with their notes. Synchronous
 * only, and the previous state comes back however `fn` ends.
 */
export function withoutNotes<T>(fn: () => T): T;
export function withoutNotes<A, T>(fn: (arg: A) => T, arg: A): T;
export function withoutNotes<A, T>(fn: (arg?: A) => T, arg?: A): T {
  const before = notesWanted;
  notesWanted = false;
  try {
    return fn(arg);
  } finally {
    notesWanted = before;
  }
}

/**
 * True unless a ranking is judging candidates it only counts (withoutNotes): a check builds its note only
 * then, so the candidates a match only counts cost no sentences at all (the note is '' otherwise).
 */
export function notesOn(): boolean {
  return notesWanted;
}

/** A number for notes: three significant digits, no exponent for everyday magnitudes. */
export function fmt(value: number, digits = 3): string {
  if (!notesWanted) return '';
  if (!Number.isFinite(value)) return String(value);
  return sig(value, digits);
}
