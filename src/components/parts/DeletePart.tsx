/** Deletes a part after a confirmation (librarians); a stale page is refused with 409. */
import { useState } from 'react';
import { sendJson } from './api.ts';

export default function DeletePart({ partId, version, mpn }: { partId: number; version: number; mpn: string }) {
  const [error, setError] = useState('');
  async function remove(): Promise<void> {
    if (!window.confirm(`Delete ${mpn} with its sources and datasheets? This cannot be undone.`)) return;
    const res = await sendJson('DELETE', `/api/parts/${partId}?version=${version}`);
    if (res.ok) window.location.assign('/parts');
    else setError(res.error);
  }
  return (
    <span>
      <button type="button" className="btn btn-quiet" onClick={remove}>
        <span aria-hidden="true">✕</span> Delete
      </button>
      {error && (
        <span role="alert" className="field-error block">
          <span aria-hidden="true">✕ </span>
          {error}
        </span>
      )}
    </span>
  );
}
