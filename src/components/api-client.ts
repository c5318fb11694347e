/** The islands' one way to call the JSON API; understands the project's one error shape. */
export interface ApiIssue {
  path: string;
  message: string;
}

export type ApiResult<T> =
  | { ok: true; status: number; data: T }
  | { ok: false; status: number; error: string; issues: ApiIssue[]; retryAfterSeconds: number | null };

export async function sendJson<T>(method: string, url: string, body?: unknown, signal?: AbortSignal): Promise<ApiResult<T>> {
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      // Every write says JSON, also a body-less DELETE: Astro's origin check treats a write without a type as a form post.
      headers: method === 'GET' ? { Accept: 'application/json' } : { 'Content-Type': 'application/json', Accept: 'application/json' },
      body: body === undefined || method === 'GET' ? undefined : JSON.stringify(body),
      credentials: 'same-origin',
      signal,
    });
  } catch (err) {
    if ((err as Error).name === 'AbortError') throw err;
    return {
      ok: false,
      status: 0,
      error: 'Could not reach Stallpoint. Check your connection and try again.',
      issues: [],
      retryAfterSeconds: null,
    };
  }
  if (res.status === 204) return { ok: true, status: 204, data: undefined as T };
  const payload = await res.json().catch(() => null);
  if (res.ok) return { ok: true, status: res.status, data: payload as T };
  const retry = Number(res.headers.get('Retry-After'));
  return {
    ok: false,
    status: res.status,
    error: (payload && typeof payload.error === 'string' && payload.error) || `The server answered ${res.status}.`,
    issues: Array.isArray(payload?.issues) ? payload.issues : [],
    retryAfterSeconds: Number.isFinite(retry) && retry > 0 ? retry : null,
  };
}

export const postJson = <T>(url: string, body: unknown, signal?: AbortSignal): Promise<ApiResult<T>> =>
  sendJson<T>('POST', url, body, signal);
