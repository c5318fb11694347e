/**
 * A buyer sets, per option of a shortlist line, the source to buy from (instead of the cheapest) and a note
 * the designer reads. Saving reloads the page so every figure is worked out again with the new choice.
 */
import { useState } from 'react';
import { sendJson, type ApiIssue } from '../api-client.ts';

export interface PreferenceRow {
  line: string;
  lineLabel: string;
  partId: number;
  /** "chosen" or "alternate 2". */
  optionLabel: string;
  mpn: string;
  sources: { id: number; label: string }[];
  sourceId: number | null;
  note: string;
}

function RowForm({ designId, row, noteMax }: { designId: number; row: PreferenceRow; noteMax: number }) {
  const [sourceId, setSourceId] = useState(row.sourceId === null ? '' : String(row.sourceId));
  const [note, setNote] = useState(row.note);
  const [issues, setIssues] = useState<ApiIssue[]>([]);
  const [error, setError] = useState('');
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent): Promise<void> {
    e.preventDefault();
    setBusy(true);
    const res = await sendJson('PUT', `/api/designs/${designId}/preferences`, {
      line: row.line,
      partId: row.partId,
      sourceId: sourceId === '' ? null : Number(sourceId),
      note: note.trim() === '' ? null : note,
    });
    if (res.ok) return window.location.reload();
    setBusy(false);
    setError(res.error);
    setIssues(res.issues);
  }
  const issue = (path: string): string | undefined => issues.find((i) => i.path === path)?.message;
  const key = `${row.line}-${row.partId}`;
  return (
    <form onSubmit={submit} className="grid gap-1 sm:grid-cols-[12rem_16rem_1fr_auto] items-end text-sm" data-testid={`preference-${key}`}>
      <span>
        <span className="font-semibold">{row.lineLabel}</span> · {row.optionLabel} · {row.mpn}
      </span>
      <label className="field">
        Buy from
        <select value={sourceId} onChange={(e) => setSourceId(e.target.value)} name="sourceId" aria-invalid={!!issue('sourceId')}>
          <option value="">the cheapest source</option>
          {row.sources.map((s) => (
            <option key={s.id} value={String(s.id)}>
              {s.label}
            </option>
          ))}
        </select>
        {issue('sourceId') && (
          <span className="field-error">
            <span aria-hidden="true">✕ </span>
            {issue('sourceId')}
          </span>
        )}
      </label>
      <label className="field">
        Note for the designer
        <input value={note} onChange={(e) => setNote(e.target.value)} name="note" maxLength={noteMax} aria-invalid={!!issue('note')} />
        {issue('note') && (
          <span className="field-error">
            <span aria-hidden="true">✕ </span>
            {issue('note')}
          </span>
        )}
      </label>
      <button type="submit" className="btn btn-quiet" disabled={busy}>
        Save
      </button>
      {error && (
        <p role="alert" className="field-error sm:col-span-4">
          <span aria-hidden="true">✕ </span>
          {error}
        </p>
      )}
    </form>
  );
}

export default function PreferenceEditor({ designId, rows, noteMax }: { designId: number; rows: PreferenceRow[]; noteMax: number }) {
  return (
    <details className="px-3 py-2 print:hidden" data-testid="preference-editor">
      <summary className="cursor-pointer text-sm font-semibold">Preferred sources and notes</summary>
      <div className="grid gap-2 mt-2">
        {rows.map((r) => (
          <RowForm key={`${r.line}-${r.partId}`} designId={designId} row={r} noteMax={noteMax} />
        ))}
      </div>
    </details>
  );
}
