/** Browser-side JSON writes for the auth and people islands; understands the one error shape. */
export interface FieldIssue {
  path: string;
  message: string;
}

export type CallResult<T> =
  | { ok: true; status: number; data: T }
  | { ok: false; status: number; error: string; issues: FieldIssue[]; retryAfterSeconds: number | null };

export async function callJson<T>(method: string, url: string, body: unknown = {}): Promise<CallResult<T>> {
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      headers: { 'Content-Type': 'application/json', Accept: 'application/json' },
      body: method === 'GET' ? undefined : JSON.stringify(body),
      credentials: 'same-origin',
    });
  } catch {
    return { ok: false, status: 0, error: 'Could not reach Stallpoint. Check the connection and try again.', issues: [], retryAfterSeconds: null };
  }
  const payload = await res.json().catch(() => null);
  if (res.ok) return { ok: true, status: res.status, data: payload as T };
  const retry = Number(res.headers.get('Retry-After'));
  return {
    ok: false,
    status: res.status,
    error: (payload && typeof payload.error === 'string' && payload.error) || `Stallpoint answered ${res.status}.`,
    issues: Array.isArray(payload?.issues) ? payload.issues : [],
    retryAfterSeconds: Number.isFinite(retry) && retry > 0 ? retry : null,
  };
}

/** The message for one field, from an error's issues. */
export function issueFor(issues: FieldIssue[], path: string): string | null {
  return issues.find((i) => i.path === path)?.message ?? null;
}

/** Only a path on this site may follow sign-in (no open redirect). OWASP ASVS 5.0 V3.7.2 (no open redirect). */
export function safeNext(next: string | null | undefined): string {
  return next && next.startsWith('/') && !next.startsWith('//') && !next.startsWith('/\\') ? next : '/';
}
