import { useEffect, useRef, useState } from 'react';
import { postJson, type ApiIssue } from '../api-client.ts';
import type { DesignInput } from '../../lib/domain/design.ts';
import type { DesignMatchPage } from '../../lib/match-page.ts';

export type MatchStatus = 'idle' | 'loading' | 'ready' | 'error';

export function issuesByPath(issues: ApiIssue[], prefix = ''): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of issues) {
    const path = prefix && i.path.startsWith(prefix) ? i.path.slice(prefix.length) : i.path;
    out[path] ??= i.message;
  }
  return out;
}

/**
 * Re-ranks the candidates shortly after every input change; older answers are discarded. `limit`: entries
 * per list ("show more" raises it); counts and picks always cover the whole ranking.
 */
export function useMatch(designId: number | null, input: DesignInput, includePending: boolean, limit: number) {
  const [match, setMatch] = useState<DesignMatchPage | null>(null);
  const [status, setStatus] = useState<MatchStatus>('idle');
  const [error, setError] = useState('');
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const abort = useRef<AbortController | null>(null);
  useEffect(() => {
    const timer = setTimeout(async () => {
      abort.current?.abort();
      const ctrl = new AbortController();
      abort.current = ctrl;
      setStatus('loading');
      const url = designId ? `/api/designs/${designId}/match` : '/api/designs/match';
      try {
        const res = await postJson<DesignMatchPage>(url, { includePending, input, limit }, ctrl.signal);
        if (res.ok) {
          setMatch(res.data);
          setFieldErrors({});
          setError('');
          setStatus('ready');
        } else {
          setFieldErrors(issuesByPath(res.issues, 'input.'));
          setError(res.error);
          setStatus('error');
        }
      } catch {
        /* superseded by a newer request */
      }
    }, 250);
    return () => clearTimeout(timer);
  }, [designId, input, includePending, limit]);
  return { match, status, error, fieldErrors };
}
