import { useState } from 'react';
import { postJson } from '../api-client.ts';

export interface BannerAlert {
  id: number;
  designId: number;
  designName: string;
  mpn: string;
  kind: 'lifecycle' | 'no-longer-holds';
  detail: string;
  createdAt: string;
}

const KIND_WORDS: Record<BannerAlert['kind'], string> = {
  lifecycle: 'Part lifecycle changed',
  'no-longer-holds': 'Design no longer holds',
};

/** Open change alerts with an Acknowledge button each; an acknowledged alert leaves the banner. */
export default function AlertBanner({ alerts, total, showDesign }: { alerts: BannerAlert[]; total: number; showDesign: boolean }) {
  const [open, setOpen] = useState(alerts);
  const [busy, setBusy] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);
  if (open.length === 0) return null;
  async function acknowledge(id: number) {
    setBusy(id);
    setError(null);
    const res = await postJson<{ id: number }>(`/api/alerts/${id}/acknowledge`, {});
    setBusy(null);
    // 409: someone else acknowledged it meanwhile, so it is no longer open either.
    if (res.ok || res.status === 409) setOpen((list) => list.filter((a) => a.id !== id));
    else setError(res.error);
  }
  const hidden = total - alerts.length;
  return (
    <section className="card p-3 mb-3 border-warn bg-warn-wash text-sm" role="status" aria-label="Change alerts" data-testid="alert-banner">
      <h2 className="text-base mb-1">
        <span aria-hidden="true">⚠ </span>Change alert{open.length === 1 ? '' : 's'}: a part used here has changed
      </h2>
      <ul className="grid gap-2">
        {open.map((a) => (
          <li key={a.id} data-alert-id={a.id} className="flex flex-wrap gap-2 items-baseline">
            <strong>{KIND_WORDS[a.kind]}</strong>
            {showDesign && (
              <a href={`/designs/${a.designId}`} data-testid="alert-design">
                {a.designName}
              </a>
            )}
            <span>{a.detail}</span>
            <span className="text-ink-soft">raised {a.createdAt.slice(0, 16).replace('T', ' ')} UTC</span>
            <button type="button" className="btn" disabled={busy === a.id} onClick={() => void acknowledge(a.id)}>
              {busy === a.id ? 'Acknowledging…' : 'Acknowledge'}
            </button>
          </li>
        ))}
      </ul>
      {hidden > 0 && (
        <p className="mt-1 text-ink-soft">
          And {hidden} more open alert{hidden === 1 ? '' : 's'}.
        </p>
      )}
      {error && (
        <p className="mt-1 text-bad" role="alert">
          ✕ {error}
        </p>
      )}
    </section>
  );
}
