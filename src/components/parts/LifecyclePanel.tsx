/** A librarian moves a part between active, NRND, last-buy and obsolete, with the date it takes effect and a note. */
import { useState } from 'react';
import { LIFECYCLE_OPTIONS } from '../../lib/labels.ts';
import type { Lifecycle } from '../../lib/domain/parts.ts';
import { sendJson, type ApiIssue } from './api.ts';

const OPTIONS = LIFECYCLE_OPTIONS;

export default function LifecyclePanel({ partId, version, current }: { partId: number; version: number; current: Lifecycle }) {
  const [lifecycle, setLifecycle] = useState<Lifecycle>(current);
  const [effectiveDate, setEffectiveDate] = useState(new Date().toISOString().slice(0, 10));
  const [note, setNote] = useState('');
  const [issues, setIssues] = useState<ApiIssue[]>([]);
  const [error, setError] = useState('');

  async function submit(e: React.FormEvent): Promise<void> {
    e.preventDefault();
    const res = await sendJson('POST', `/api/parts/${partId}/lifecycle`, { lifecycle, effectiveDate, note, version });
    if (res.ok) return window.location.reload();
    setError(res.error);
    setIssues(res.issues);
  }
  const issue = (path: string) => issues.find((i) => i.path === path)?.message;

  return (
    <form onSubmit={submit} className="grid gap-2 text-sm" data-testid="lifecycle-form">
      <label className="field">
        Move to
        <select value={lifecycle} onChange={(e) => setLifecycle(e.target.value as Lifecycle)} name="lifecycle">
          {OPTIONS.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      </label>
      <label className="field">
        Effective from
        <input
          type="date"
          value={effectiveDate}
          onChange={(e) => setEffectiveDate(e.target.value)}
          name="effectiveDate"
          aria-invalid={!!issue('effectiveDate')}
        />
        {issue('effectiveDate') && (
          <span className="field-error">
            <span aria-hidden="true">✕ </span>
            {issue('effectiveDate')}
          </span>
        )}
      </label>
      <label className="field">
        Note (notice number, reason, replacement)
        <input value={note} onChange={(e) => setNote(e.target.value)} name="note" maxLength={500} aria-invalid={!!issue('note')} />
        {issue('note') && (
          <span className="field-error">
            <span aria-hidden="true">✕ </span>
            {issue('note')}
          </span>
        )}
      </label>
      <div>
        <button type="submit" className="btn">
          Record lifecycle change
        </button>
      </div>
      {error && (
        <p role="alert" className="field-error">
          <span aria-hidden="true">✕ </span>
          {error}
        </p>
      )}
    </form>
  );
}
