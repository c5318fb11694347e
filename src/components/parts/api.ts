/** JSON calls from the islands; a refusal comes back in the one error shape. */
export interface ApiIssue {
  path: string;
  message: string;
}

export type ApiResult<T> = { ok: true; status: number; data: T } | { ok: false; status: number; error: string; issues: ApiIssue[] };

export async function sendJson<T>(method: string, url: string, body?: unknown): Promise<ApiResult<T>> {
  try {
    const res = await fetch(url, {
      method,
      // Every write says JSON, also a body-less DELETE: Astro's origin check treats a write without a type as a form post.
      headers: method === 'GET' ? { Accept: 'application/json' } : { 'Content-Type': 'application/json', Accept: 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    if (res.status === 204) return { ok: true, status: 204, data: undefined as T };
    const data = await res.json().catch(() => null);
    if (res.ok) return { ok: true, status: res.status, data: data as T };
    return { ok: false, status: res.status, error: data?.error ?? `The server answered ${res.status}.`, issues: data?.issues ?? [] };
  } catch {
    return { ok: false, status: 0, error: 'The server could not be reached. Check the connection and try again.', issues: [] };
  }
}
