import { useEffect, useRef, useState } from 'react';
import { postJson, type ApiIssue } from '../api-client.ts';
import type { DesignInput } from '../../lib/domain/design.ts';
import type { DesignMatch } from '../../lib/design-match.ts';

export type MatchStatus = 'idle' | 'loading' | 'ready' | 'error';

export function issuesByPath(issues: ApiIssue[], prefix = ''): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of issues) {
    const path = prefix && i.path.startsWith(prefix) ? i.path.slice(prefix.length) : i.path;
    out[path] ??= i.message;
  }
  return out;
}

/** Re-ranks the candidates shortly after every input change; older answers are discarded. */
export function useMatch(designId: number | null, input: DesignInput, includePending: boolean) {
  const [match, setMatch] = useState<DesignMatch | null>(null);
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
        const res = await postJson<DesignMatch>(url, { includePending, input }, ctrl.signal);
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
  }, [designId, input, includePending]);
  return { match, status, error, fieldErrors };
}
