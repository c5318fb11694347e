/** Text formatting for the design report: values with units, margins, verdicts, prices. */
import type { Check, Verdict } from '../../lib/checks.ts';
import type { PriceAtQty } from '../../lib/design-match.ts';
import { checkFigure, checkLabel, checkLabelInline, checkLabelList } from '../../lib/design-words.ts';
import { measure, percent, price as formatPrice, sig } from '../../lib/units.ts';

export { percent, sig };

/** A check's value or limit with an SI prefix where the unit takes one (see units.ts `measure`). */
export function quantity(value: number | null, unit: string, digits = 3): string {
  return measure(value, unit, digits);
}

export function range(min: number, max: number, unit: string): string {
  return min === max ? quantity(min, unit) : `${sig(min)}–${sig(max)} ${unit}`;
}

/** Unit price at the build quantity; `short` gives "EUR 0.3620 @ 25" for table cells. */
export function money(price: PriceAtQty | null, short = false): string {
  if (price == null) return 'no price';
  const amount = formatPrice(price.unitPrice, '').trim();
  return short ? `${price.currency} ${amount} @ ${price.qty}` : `${price.currency} ${amount} each at ${price.qty}`;
}

export function isoDate(at: Date): string {
  return at.toISOString().slice(0, 10);
}

export function isoMinute(at: Date): string {
  return `${at.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

const VERDICT_SYMBOL: Readonly<Record<Verdict, string>> = { pass: '✓', marginal: '!', fail: '✕' };

/** Verdict as words (never colour alone): "✓ pass" when the font has the marks, else "PASS". */
export function verdictText(verdict: Verdict, fontHasMarks: boolean): string {
  return fontHasMarks ? `${VERDICT_SYMBOL[verdict]} ${verdict}` : verdict.toUpperCase();
}

export const VERDICT_MARKS = '✓✕';

/** @deprecated the one table is design-words' checkLabel; kept so older callers read the same names. */
export const checkTitle = checkLabel;

export function checkOkText(check: Check): string {
  if (check.ok) return 'yes';
  return check.severity === 'margin' ? 'no (margin)' : 'no (rating)';
}

/** One table row per check: check, value, limit, margin, ok, note. */
export function checkRow(check: Check): string[] {
  return [
    checkLabel(check.id),
    checkFigure(check.value, check.unit),
    checkFigure(check.limit, check.unit),
    percent(check.margin),
    checkOkText(check),
    check.note,
  ];
}

/** One line for an alternate: what falls short, or else the tightest margin. */
export function summaryOf(checks: readonly Check[]): string {
  const failing = checks.filter((c) => !c.ok);
  if (failing.length > 0) return `Short on ${checkLabelList(failing.map((c) => c.id))}: ${failing[0].note}`;
  const withMargin = checks.filter((c) => c.margin != null).sort((a, b) => (a.margin as number) - (b.margin as number));
  const tightest = withMargin[0];
  const all = `All ${checks.length} checks hold`;
  return tightest ? `${all}; tightest is ${checkLabelInline(tightest.id)} at ${percent(tightest.margin)} margin.` : `${all}.`;
}
