/** JSON calls for the auth and people islands, through the shared client (src/components/api-client.ts). */
import { sendJson, type ApiIssue, type ApiResult } from '../api-client.ts';

export type FieldIssue = ApiIssue;
export type CallResult<T> = ApiResult<T>;

/** A JSON call whose writes always carry a body ({} when none is given). */
export function callJson<T>(method: string, url: string, body: unknown = {}): Promise<CallResult<T>> {
  return sendJson<T>(method, url, body);
}

/** The message for one field, from an error's issues. */
export function issueFor(issues: FieldIssue[], path: string): string | null {
  return issues.find((i) => i.path === path)?.message ?? null;
}

/** Only a path on this site may follow sign-in (no open redirect). OWASP ASVS 5.0 V3.7.2 (no open redirect). */
export function safeNext(next: string | null | undefined): string {
  return next && next.startsWith('/') && !next.startsWith('//') && !next.startsWith('/\\') ? next : '/';
}
