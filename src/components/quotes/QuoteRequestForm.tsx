/**
 * "Request a quote" under a shortlist design: the buyer ticks lines (chosen parts or alternates), picks a
 * supplier contact, and sends. The send carries one key per form, so a double click (or a retry after a
 * lost answer) sends one mail; a new key is made only after a send went through.
 */
import { useState } from 'react';
import { sendJson, type ApiIssue } from '../api-client.ts';

export interface QuoteRow {
  line: string;
  lineLabel: string;
  partId: number;
  optionLabel: string;
  mpn: string;
  manufacturer: string;
  quantityNeeded: number;
  orderQuantity: number;
}

export interface ContactOption {
  id: number;
  label: string;
}

const newKey = (): string =>
  typeof crypto !== 'undefined' && 'randomUUID' in crypto ? crypto.randomUUID() : `k${Date.now()}${Math.random().toString(36).slice(2)}`;

export default function QuoteRequestForm({ designId, rows, contacts }: { designId: number; rows: QuoteRow[]; contacts: ContactOption[] }) {
  const [picked, setPicked] = useState<Set<number>>(new Set());
  const [contactId, setContactId] = useState(contacts[0] ? String(contacts[0].id) : '');
  const [wantedBy, setWantedBy] = useState('');
  const [notes, setNotes] = useState('');
  const [key, setKey] = useState(newKey);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState('');
  const [issues, setIssues] = useState<ApiIssue[]>([]);
  const [sent, setSent] = useState<{ id: number; to: string } | null>(null);

  const toggle = (i: number) =>
    setPicked((p) => {
      const next = new Set(p);
      if (next.has(i)) next.delete(i);
      else next.add(i);
      return next;
    });

  async function submit(e: React.FormEvent): Promise<void> {
    e.preventDefault();
    if (busy) return;
    setBusy(true);
    setError('');
    setIssues([]);
    const lines = [...picked]
      .sort((a, b) => a - b)
      .map((i) => rows[i])
      .map((r) => ({ designId, line: r.line, partId: r.partId, quantityNeeded: r.quantityNeeded, orderQuantity: r.orderQuantity }));
    const res = await sendJson<{ quote: { id: number; contact: { email: string } } }>('POST', '/api/quotes', {
      contactId: contactId === '' ? null : Number(contactId),
      idempotencyKey: key,
      wantedBy: wantedBy === '' ? null : wantedBy,
      notes: notes.trim() === '' ? null : notes,
      lines,
    });
    setBusy(false);
    if (res.ok) {
      setSent({ id: res.data.quote.id, to: res.data.quote.contact.email });
      setPicked(new Set());
      setKey(newKey());
      return;
    }
    setError(res.error);
    setIssues(res.issues);
  }
  const issue = (path: string): string | undefined => issues.find((i) => i.path === path || i.path.startsWith(`${path}.`))?.message;

  return (
    <details className="px-3 py-2 print:hidden" data-testid="quote-request-form">
      <summary className="cursor-pointer text-sm font-semibold">
        <span aria-hidden="true">✉ </span>Request a quote
      </summary>
      {contacts.length === 0 ? (
        <p className="text-sm text-ink-soft mt-2">
          No supplier contact yet: add one on <a href="/quotes">Quote requests</a>.
        </p>
      ) : (
        <form onSubmit={submit} className="grid gap-2 mt-2 text-sm">
          <fieldset>
            <legend className="font-semibold">Lines to quote</legend>
            {rows.map((r, i) => (
              <label key={`${r.line}-${r.partId}`} className="flex gap-2 items-center">
                <input type="checkbox" checked={picked.has(i)} onChange={() => toggle(i)} name={`line-${r.line}-${r.partId}`} />
                <span>
                  {r.lineLabel} · {r.optionLabel} · <span className="font-semibold">{r.mpn}</span> {r.manufacturer} · need{' '}
                  {r.quantityNeeded}, order {r.orderQuantity}
                </span>
              </label>
            ))}
            {issue('lines') && (
              <span className="field-error">
                <span aria-hidden="true">✕ </span>
                {issue('lines')}
              </span>
            )}
          </fieldset>
          <div className="grid gap-2 sm:grid-cols-3 items-end">
            <label className="field">
              Supplier contact
              <select value={contactId} onChange={(e) => setContactId(e.target.value)} name="contactId" aria-invalid={!!issue('contactId')}>
                {contacts.map((c) => (
                  <option key={c.id} value={String(c.id)}>
                    {c.label}
                  </option>
                ))}
              </select>
            </label>
            <label className="field">
              Wanted by (optional)
              <input type="date" value={wantedBy} onChange={(e) => setWantedBy(e.target.value)} name="wantedBy" />
            </label>
            <label className="field">
              Notes for the supplier (optional)
              <input value={notes} onChange={(e) => setNotes(e.target.value)} name="notes" maxLength={1000} />
            </label>
          </div>
          <p>
            <button type="submit" className="btn" disabled={busy || picked.size === 0}>
              <span aria-hidden="true">✉ </span>
              {busy ? 'Sending…' : `Send the request (${picked.size} ${picked.size === 1 ? 'line' : 'lines'})`}
            </button>
          </p>
          {error && (
            <p role="alert" className="field-error">
              <span aria-hidden="true">✕ </span>
              {error}
            </p>
          )}
          {sent && (
            <p role="status" className="text-ok" data-testid="quote-sent">
              <span aria-hidden="true">✓ </span>Sent to {sent.to}: <a href={`/quotes/${sent.id}`}>quote request Q-{sent.id}</a>.
            </p>
          )}
        </form>
      )}
    </details>
  );
}
