/**
 * How a supply report reads to a person (workspace, calculators page, report PDF): the checks' names in
 * words, each check's verdict, values with their units, and the bulk-capacitance figure with its
 * "not practical" flag [docs/engineering.md §3.3, §3.4]. Pure, browser-safe.
 */
import type { Check, Verdict } from './checks.ts';
import { checkLabel } from './design-words.ts';
import { IMPRACTICAL_BULK_CAPACITANCE_F } from './supply.ts';
import { formatSi, quantity } from './units.ts';

/** @deprecated the one table is design-words' checkLabel; kept so older callers read the same names. */
export const supplyCheckTitle = checkLabel;

/** One check's own verdict: holds → pass; short only on a margin → marginal; a rating broken → fail. */
export function checkVerdict(check: Pick<Check, 'ok' | 'severity'>): Verdict {
  if (check.ok) return 'pass';
  return check.severity === 'margin' ? 'marginal' : 'fail';
}

/** "1.53 A", "500 mA", "2.54 V"; an em dash when there is no number. */
export function quantityText(value: number | null, unit: string): string {
  if (value == null || !Number.isFinite(value)) return '—';
  return formatSi(value, unit, 3)
    .replace(/(\.\d*?)0+(?=\s)/, '$1')
    .replace(/\.(?=\s)/, '');
}

/** Torques in mN·m whatever their size (0.637 mN·m, not 637 µN·m): the unit the motor's figures use. */
export function torqueText(torqueNm: number | null): string {
  if (torqueNm == null || !Number.isFinite(torqueNm)) return '—';
  return quantity(torqueNm * 1000, 'mN·m');
}

/** Which way the limit binds: the running and start currents must stay at or below it, the rail at or above. */
export function limitRelation(id: string): '≤' | '≥' {
  return id === 'logic-brownout' ? '≥' : '≤';
}

export interface BulkCapacitanceView {
  text: string;
  /** False from tenths of a farad up: a separate supply or a soft start is the answer, not a capacitor. */
  practical: boolean;
}

/** The ride-through capacitor in µF, mF or F; null when there is no figure. */
export function bulkCapacitanceView(capacitanceF: number | null): BulkCapacitanceView | null {
  if (capacitanceF == null || !Number.isFinite(capacitanceF)) return null;
  const practical = capacitanceF < IMPRACTICAL_BULK_CAPACITANCE_F;
  if (capacitanceF === 0) return { text: 'none needed', practical };
  return { text: practical ? quantityText(capacitanceF, 'F') : quantity(capacitanceF, 'F'), practical };
}
