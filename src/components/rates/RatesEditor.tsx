/** An admin sets the exchange rate of a currency into the organisation's currency, with the day it applies from. */
import { useState } from 'react';
import { sendJson, type ApiIssue } from '../api-client.ts';

export default function RatesEditor({ orgCurrency }: { orgCurrency: string }) {
  const [currency, setCurrency] = useState('');
  const [rate, setRate] = useState('');
  const [asOf, setAsOf] = useState(new Date().toISOString().slice(0, 10));
  const [issues, setIssues] = useState<ApiIssue[]>([]);
  const [error, setError] = useState('');

  async function submit(e: React.FormEvent): Promise<void> {
    e.preventDefault();
    const rateToOrg = rate.trim() === '' ? null : Number(rate);
    const res = await sendJson('PUT', '/api/rates', { currency, rateToOrg, asOf });
    if (res.ok) return window.location.reload();
    setError(res.error);
    setIssues(res.issues);
  }
  const issue = (path: string): string | undefined => issues.find((i) => i.path === path)?.message;
  const fieldError = (path: string) =>
    issue(path) && (
      <span className="field-error">
        <span aria-hidden="true">✕ </span>
        {issue(path)}
      </span>
    );

  return (
    <form onSubmit={submit} className="grid gap-2 text-sm max-w-md" data-testid="rate-form">
      <label className="field">
        Currency (ISO 4217)
        <input
          value={currency}
          onChange={(e) => setCurrency(e.target.value)}
          name="currency"
          maxLength={3}
          aria-invalid={!!issue('currency')}
        />
        {fieldError('currency')}
      </label>
      <label className="field">
        One unit is worth … {orgCurrency}
        <input
          value={rate}
          onChange={(e) => setRate(e.target.value)}
          name="rateToOrg"
          inputMode="decimal"
          aria-invalid={!!issue('rateToOrg')}
        />
        {fieldError('rateToOrg')}
      </label>
      <label className="field">
        Applies from
        <input type="date" value={asOf} onChange={(e) => setAsOf(e.target.value)} name="asOf" aria-invalid={!!issue('asOf')} />
        {fieldError('asOf')}
      </label>
      <div>
        <button type="submit" className="btn">
          Save rate
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
