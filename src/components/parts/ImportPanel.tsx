/** CSV import: choose a file, see every row's outcome and errors (nothing written), then import all rows at once. */
import { useState } from 'react';

interface Row {
  line: number;
  outcome: 'ready' | 'created' | 'invalid';
  category: string;
  manufacturer: string;
  mpn: string;
  partId?: number;
}
interface ImportErrorItem {
  line: number;
  column: string;
  message: string;
}
interface Report {
  mode: string;
  rows: Row[];
  errors: ImportErrorItem[];
  counts: { rows: number; ready: number; invalid: number; created: number };
  replayed?: boolean;
}

/** What /api/imports answers: a report, or the error shape (a refused commit carries its report too). */
type ImportAnswer = (Partial<Report> & { error?: string }) | null;

async function post(mode: 'preview' | 'commit', csv: string, key?: string): Promise<{ status: number; body: ImportAnswer }> {
  try {
    const res = await fetch(`/api/imports?mode=${mode}`, {
      method: 'POST',
      headers: { 'Content-Type': 'text/csv', Accept: 'application/json', ...(key ? { 'Idempotency-Key': key } : {}) },
      body: csv,
    });
    return { status: res.status, body: await res.json().catch(() => null) };
  } catch {
    return { status: 0, body: { error: 'The server could not be reached.' } };
  }
}

export default function ImportPanel() {
  const [csv, setCsv] = useState('');
  const [fileName, setFileName] = useState('');
  const [report, setReport] = useState<Report | null>(null);
  const [error, setError] = useState('');
  const [busy, setBusy] = useState(false);
  const [key, setKey] = useState('');

  async function choose(file: File | undefined): Promise<void> {
    setReport(null);
    setError('');
    if (!file) return;
    setFileName(file.name);
    const text = await file.text();
    setCsv(text);
    setKey(`import-${crypto.randomUUID()}`); // one key per chosen file: a repeated click imports once
    setBusy(true);
    const res = await post('preview', text);
    setBusy(false);
    if (res.status === 200) setReport(res.body as Report);
    else setError(res.body?.error ?? `The server answered ${res.status}.`);
  }

  async function commit(): Promise<void> {
    setBusy(true);
    const res = await post('commit', csv, key);
    setBusy(false);
    if (res.status === 201 || res.status === 200) setReport(res.body as Report);
    else {
      setError(res.body?.error ?? `The server answered ${res.status}.`);
      if (res.body?.rows) setReport(res.body as Report);
    }
  }

  return (
    <div className="grid gap-3" data-testid="import-panel">
      <label className="field max-w-md">
        CSV file (format in the README: one part per row, units in the column names)
        <input type="file" accept=".csv,text/csv" onChange={(e) => choose(e.target.files?.[0])} name="csv" />
      </label>
      {busy && (
        <p className="text-sm text-ink-soft" aria-live="polite">
          <span aria-hidden="true">⟳ </span>Working…
        </p>
      )}
      {error && (
        <p role="alert" className="text-bad">
          <span aria-hidden="true">✕ </span>
          {error}
        </p>
      )}
      {report && (
        <section className="card p-3 grid gap-2" aria-label="Import result">
          <p data-testid="import-summary">
            <strong>{fileName}</strong>: {report.counts.rows} rows ·{' '}
            {report.mode === 'commit' && report.counts.created > 0 ? (
              <span className="text-ok">
                <span aria-hidden="true">✓ </span>
                {report.counts.created} parts imported
                {report.replayed ? ' (already done earlier with this file; nothing imported twice)' : ''}, waiting in the review queue
                unless the file said otherwise.
              </span>
            ) : (
              <>
                {report.counts.ready} ready,{' '}
                <span className={report.counts.invalid ? 'text-bad' : ''}>
                  {report.counts.invalid ? '✕ ' : ''}
                  {report.counts.invalid} with problems
                </span>
              </>
            )}
          </p>
          {report.errors.length > 0 && (
            <div className="table-scroll">
              <table className="data-table text-sm" data-testid="import-errors">
                <thead>
                  <tr>
                    <th className="num">Line</th>
                    <th>Column</th>
                    <th>Problem</th>
                  </tr>
                </thead>
                <tbody>
                  {report.errors.map((e, i) => (
                    <tr key={i}>
                      <td className="num">{e.line}</td>
                      <td>{e.column}</td>
                      <td>{e.message}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
          {report.mode === 'preview' && report.errors.length === 0 && report.counts.ready > 0 && (
            <div>
              <button type="button" className="btn" disabled={busy} onClick={commit}>
                Import all {report.counts.ready} parts
              </button>
              <span className="text-sm text-ink-soft ml-2">All rows go in together, or none do.</span>
            </div>
          )}
          {report.mode === 'preview' && report.errors.length > 0 && (
            <p className="text-sm">Fix the file and choose it again: nothing is imported while any row has a problem.</p>
          )}
          {report.mode === 'commit' && (
            <ul className="text-sm grid gap-0.5">
              {report.rows.map((r) => (
                <li key={r.line}>
                  line {r.line}: {r.partId ? <a href={`/parts/${r.partId}`}>{r.mpn}</a> : r.mpn}
                </li>
              ))}
            </ul>
          )}
        </section>
      )}
    </div>
  );
}
