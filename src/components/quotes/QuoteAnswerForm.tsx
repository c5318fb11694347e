/**
 * The buyer enters the supplier's answer per line of a sent request (unit price, currency, MOQ, lead time,
 * valid until); lines left without a price are not answered. Closing is its own button. Both reload the page.
 */
import { useState } from 'react';
import { sendJson, type ApiIssue } from '../api-client.ts';

export interface AnswerRow {
  lineId: number;
  lineNo: number;
  mpn: string;
  manufacturer: string;
  orderQty: number;
}

interface Draft {
  unitPrice: string;
  currency: string;
  moq: string;
  leadTimeDays: string;
  validUntil: string;
}

export default function QuoteAnswerForm({
  quoteId,
  rows,
  canAnswer,
  canClose,
  defaultCurrency,
}: {
  quoteId: number;
  rows: AnswerRow[];
  canAnswer: boolean;
  canClose: boolean;
  defaultCurrency: string;
}) {
  const [drafts, setDrafts] = useState<Draft[]>(() =>
    rows.map((r) => ({ unitPrice: '', currency: defaultCurrency, moq: String(r.orderQty), leadTimeDays: '', validUntil: '' })),
  );
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState('');
  const [issues, setIssues] = useState<ApiIssue[]>([]);
  const set = (i: number, k: keyof Draft, v: string) => setDrafts((d) => d.map((x, j) => (j === i ? { ...x, [k]: v } : x)));

  const filled = drafts.map((d, i) => ({ d, i })).filter(({ d }) => d.unitPrice.trim() !== '');
  async function answer(e: React.FormEvent): Promise<void> {
    e.preventDefault();
    setBusy(true);
    const res = await sendJson('POST', `/api/quotes/${quoteId}/answer`, {
      lines: filled.map(({ d, i }) => ({
        lineId: rows[i].lineId,
        unitPrice: Number(d.unitPrice),
        currency: d.currency,
        moq: Number(d.moq),
        leadTimeDays: Number(d.leadTimeDays),
        validUntil: d.validUntil,
      })),
    });
    if (res.ok) return window.location.reload();
    setBusy(false);
    setError(res.error);
    setIssues(res.issues);
  }
  async function close(): Promise<void> {
    setBusy(true);
    const res = await sendJson('POST', `/api/quotes/${quoteId}/close`, {});
    if (res.ok) return window.location.reload();
    setBusy(false);
    setError(res.error);
    setIssues(res.issues);
  }
  /** An issue of the row shown at position `i` (the body numbers only the filled rows). */
  const issue = (i: number, key: string): string | undefined => {
    const at = filled.findIndex((f) => f.i === i);
    return at < 0 ? undefined : issues.find((x) => x.path === `lines.${at}.${key}`)?.message;
  };
  const input = (i: number, key: keyof Draft, label: string, type: string, extra: Record<string, string> = {}) => (
    <label className="field">
      {label}
      <input
        type={type}
        value={drafts[i][key]}
        onChange={(e) => set(i, key, e.target.value)}
        name={`${key}-${rows[i].lineNo}`}
        {...extra}
      />
      {issue(i, key) && (
        <span className="field-error">
          <span aria-hidden="true">✕ </span>
          {issue(i, key)}
        </span>
      )}
    </label>
  );
  return (
    <div className="grid gap-3 text-sm" data-testid="quote-answer">
      {canAnswer && (
        <form onSubmit={answer} className="grid gap-2">
          <h2 className="text-lg">Enter the supplier's answer</h2>
          <p className="text-ink-soft">Leave the unit price empty on a line the supplier did not quote.</p>
          {rows.map((r, i) => (
            <fieldset key={r.lineId} className="grid gap-2 sm:grid-cols-[14rem_repeat(5,1fr)] items-end">
              <legend className="sr-only">Line {r.lineNo}</legend>
              <span>
                {r.lineNo}. <span className="font-semibold">{r.mpn}</span> {r.manufacturer}
              </span>
              {input(i, 'unitPrice', 'Unit price', 'number', { step: 'any', min: '0' })}
              {input(i, 'currency', 'Currency', 'text', { maxLength: '3' })}
              {input(i, 'moq', 'MOQ', 'number', { step: '1', min: '1' })}
              {input(i, 'leadTimeDays', 'Lead time, days', 'number', { step: '1', min: '0' })}
              {input(i, 'validUntil', 'Valid until', 'date')}
            </fieldset>
          ))}
          <p>
            <button type="submit" className="btn" disabled={busy || filled.length === 0}>
              <span aria-hidden="true">✓ </span>Save the answer ({filled.length} {filled.length === 1 ? 'line' : 'lines'})
            </button>
          </p>
        </form>
      )}
      {canClose && (
        <p>
          <button type="button" className="btn btn-quiet" disabled={busy} onClick={close}>
            <span aria-hidden="true">■ </span>Close this request
          </button>
        </p>
      )}
      {error && (
        <p role="alert" className="field-error">
          <span aria-hidden="true">✕ </span>
          {error}
        </p>
      )}
    </div>
  );
}
