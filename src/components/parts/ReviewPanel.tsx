/** A librarian approves a proposed part, or rejects it with a reason the proposer is sent. */
import { useState } from 'react';
import { sendJson } from './api.ts';

interface Props {
  partId: number;
  version: number;
  mpn: string;
  canReject: boolean;
  /** Where to go after a decision (the queue reloads; the part page reloads itself). */
  after?: string;
  /** The four-eyes rule's reason this person may not approve, if any. */
  approveBlocked?: string | null;
  /** An admin approving their own work: the approval is recorded as an override. */
  override?: boolean;
}

export default function ReviewPanel({ partId, version, mpn, canReject, after, approveBlocked, override }: Props) {
  const [reason, setReason] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<{ message: string; field?: string } | null>(null);
  const [done, setDone] = useState('');

  async function decide(decision: 'approve' | 'reject'): Promise<void> {
    setBusy(true);
    setError(null);
    const res = await sendJson('POST', `/api/parts/${partId}/review`, { decision, reason, version });
    setBusy(false);
    if (!res.ok) {
      setError({ message: res.status === 409 ? `${res.error} ${res.issues[0]?.message ?? ''}` : res.error, field: res.issues[0]?.path });
      return;
    }
    setDone(decision === 'approve' ? `${mpn} approved.` : `${mpn} rejected; the proposer is told why.`);
    window.location.assign(after ?? window.location.pathname);
  }

  return (
    <div className="grid gap-2 text-sm" data-testid={`review-${partId}`}>
      {canReject && (
        <label className="field">
          Reason, if you reject (the proposer reads it)
          <textarea
            className="border border-rule rounded p-1 bg-white text-ink"
            rows={2}
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            aria-invalid={error?.field === 'reason'}
            name="reason"
          />
          {error?.field === 'reason' && (
            <span className="field-error" role="alert">
              <span aria-hidden="true">✕ </span>
              {error.message}
            </span>
          )}
        </label>
      )}
      {approveBlocked && (
        <p className="text-sm" data-testid="four-eyes">
          <span aria-hidden="true">! </span>
          {approveBlocked}
        </p>
      )}
      {override && (
        <p className="text-sm" data-testid="four-eyes">
          <span aria-hidden="true">! </span>
          You entered or last edited this part; approving it is recorded as an admin override of the four-eyes rule.
        </p>
      )}
      <div className="flex gap-2">
        <button type="button" className="btn" disabled={busy || !!approveBlocked} onClick={() => decide('approve')}>
          <span aria-hidden="true">✓</span> Approve{override ? ' (admin override)' : ''}
        </button>
        {canReject && (
          <button type="button" className="btn btn-quiet" disabled={busy} onClick={() => decide('reject')}>
            <span aria-hidden="true">✕</span> Reject
          </button>
        )}
      </div>
      {error && error.field !== 'reason' && (
        <p role="alert" className="field-error">
          <span aria-hidden="true">✕ </span>
          {error.message}
        </p>
      )}
      {done && (
        <p className="text-ok" aria-live="polite">
          <span aria-hidden="true">✓ </span>
          {done}
        </p>
      )}
    </div>
  );
}
