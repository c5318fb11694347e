/**
 * Compare ticked search results against a chosen design: the designs the person can read (GET
 * /api/designs), and a link to that design's comparison page for up to four parts of one role.
 */
import { useEffect, useState } from 'react';

interface Props {
  role: 'switch' | 'driver' | 'diode';
  ids: number[];
  max: number;
}

export default function CompareBar({ role, ids, max }: Props) {
  const [designs, setDesigns] = useState<{ id: number; name: string }[] | null>(null);
  const [designId, setDesignId] = useState('');
  useEffect(() => {
    let live = true;
    fetch('/api/designs?pageSize=100', { headers: { Accept: 'application/json' } })
      .then((res) => (res.ok ? res.json() : { items: [] }))
      .then((body: { items: { id: number; name: string }[] }) => live && setDesigns(body.items))
      .catch(() => live && setDesigns([]));
    return () => {
      live = false;
    };
  }, []);
  const href = designId && ids.length > 0 ? `/designs/${designId}/compare?role=${role}&ids=${ids.join(',')}` : null;
  return (
    <div className="flex flex-wrap items-end gap-2 text-sm mb-2" data-testid="search-compare">
      <label className="field">
        Compare against design
        <select value={designId} onChange={(e) => setDesignId(e.target.value)} data-testid="compare-design">
          <option value="">{designs === null ? 'Loading designs…' : designs.length === 0 ? 'No designs yet' : 'Choose a design'}</option>
          {(designs ?? []).map((d) => (
            <option key={d.id} value={d.id}>
              {d.name}
            </option>
          ))}
        </select>
      </label>
      {href ? (
        <a className="btn btn-quiet no-underline" href={href} data-testid="search-compare-link">
          <span aria-hidden="true">⇆ </span>Compare {ids.length} at that design’s drive
        </a>
      ) : (
        <span className="text-ink-soft">
          Tick up to {max} rows under “Compare”{designId ? '' : ' and choose a design'} to see every check side by side.
        </span>
      )}
    </div>
  );
}
