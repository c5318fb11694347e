/** Browser-side JSON calls that understand the project's one error shape. */
export interface ApiIssue {
  path: string;
  message: string;
}

export type ApiResult<T> =
  | { ok: true; data: T }
  | { ok: false; status: number; error: string; issues: ApiIssue[] };

export async function sendJson<T>(method: string, url: string, body: unknown, signal?: AbortSignal): Promise<ApiResult<T>> {
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      headers: { 'Content-Type': 'application/json', Accept: 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
      signal,
    });
  } catch (err) {
    if ((err as Error).name === 'AbortError') throw err;
    return { ok: false, status: 0, error: 'Could not reach Stallpoint. Check your connection and try again.', issues: [] };
  }
  const payload = await res.json().catch(() => null);
  if (res.ok) return { ok: true, data: payload as T };
  return {
    ok: false,
    status: res.status,
    error: (payload && typeof payload.error === 'string' && payload.error) || `The server answered ${res.status}.`,
    issues: Array.isArray(payload?.issues) ? payload.issues : [],
  };
}

export const postJson = <T>(url: string, body: unknown, signal?: AbortSignal): Promise<ApiResult<T>> =>
  sendJson<T>('POST', url, body, signal);
