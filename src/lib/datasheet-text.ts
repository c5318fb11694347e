/**
 * Does a datasheet's text belong to the part it is attached to? Two plain checks on the text of its first
 * pages (read by the PDF inspection worker):
 * 1. the part number occurs in it, both compared without case, spaces or dashes ("cwn30l02 s3" and
 *    "CWN30L02–S3" both match CWN30L02-S3), since datasheets set part numbers in many ways;
 * 2. the text does not name another kind of part strongly: it says words of another kind (KIND_WORDS) and
 *    none of the part's own kind. "Body diode" in a MOSFET sheet is no mismatch (it also says MOSFET);
 *    a rectifier sheet that never says MOSFET, N-channel or drain-source is one, on a MOSFET.
 * Either failing, or no text at all (a scanned sheet), asks the person to confirm before it attaches.
 */
import type { PartCategory } from './domain/parts.ts';

/** Words that name each kind of part; compared the same way as part numbers (no case, spaces, dashes). */
export const KIND_WORDS: Readonly<Record<PartCategory, readonly string[]>> = {
  mosfet: ['MOSFET', 'N-channel', 'P-channel', 'drain-source', 'field-effect transistor'],
  diode: ['Schottky', 'rectifier', 'diode'],
  driver: ['gate driver', 'MOSFET driver', 'low-side driver', 'high-side driver', 'half-bridge driver'],
  motor: ['DC motor', 'no-load speed', 'stall torque'],
};

export const KIND_NAMES: Readonly<Record<PartCategory, string>> = {
  mosfet: 'MOSFET',
  diode: 'diode',
  driver: 'gate driver',
  motor: 'motor',
};

/** Lower case, compatibility forms folded, every space and dash (hyphen, en and em dash, minus sign) removed. */
export function matchForm(s: string): string {
  return s
    .normalize('NFKC')
    .toLowerCase()
    .replace(/[\s\u00ad\u2010-\u2015\u2212-]+/gu, '');
}

export interface DatasheetTextCheck {
  /** The first pages held any letters or digits. */
  hasText: boolean;
  mpnFound: boolean;
  /** Words of the part's own kind found in the text. */
  ownWords: string[];
  /** Another kind the text names while naming none of the part's own kind (the one with most words found). */
  otherKind: { category: PartCategory; words: string[] } | null;
}

export type DatasheetTextProblem = 'no-text' | 'part-number-missing' | 'other-kind';

function wordsFound(text: string, category: PartCategory): string[] {
  return KIND_WORDS[category].filter((w) => text.includes(matchForm(w)));
}

export function checkDatasheetText(part: { mpn: string; category: PartCategory }, text: string): DatasheetTextCheck {
  const hasText = /[\p{L}\p{N}]/u.test(text);
  const folded = matchForm(text);
  const ownWords = wordsFound(folded, part.category);
  let otherKind: DatasheetTextCheck['otherKind'] = null;
  if (ownWords.length === 0)
    for (const category of Object.keys(KIND_WORDS) as PartCategory[]) {
      if (category === part.category) continue;
      const words = wordsFound(folded, category);
      if (words.length > (otherKind?.words.length ?? 0)) otherKind = { category, words };
    }
  const mpn = matchForm(part.mpn);
  return { hasText, mpnFound: hasText && mpn !== '' && folded.includes(mpn), ownWords, otherKind };
}

/** What needs a confirmation; empty when the text fits the part. No text at all is the only problem then. */
export function datasheetTextProblems(check: DatasheetTextCheck): DatasheetTextProblem[] {
  if (!check.hasText) return ['no-text'];
  const problems: DatasheetTextProblem[] = [];
  if (!check.mpnFound) problems.push('part-number-missing');
  if (check.otherKind) problems.push('other-kind');
  return problems;
}
