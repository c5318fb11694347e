/** The one error shape: {"error": sentence, "issues": [{path, message}]}, and helpers for JSON endpoints. */
import type { z } from 'zod';
import { issuesOf, type ApiIssue } from '../../lib/schemas/issues.ts';

export type { ApiIssue };

export function jsonError(status: number, error: string, issues: ApiIssue[] = [], headers: Record<string, string> = {}): Response {
  return Response.json({ error, issues }, { status, headers: { 'Cache-Control': 'no-store', ...headers } });
}

export const zodIssues = (error: z.ZodError): ApiIssue[] => issuesOf(error);

export const MAX_JSON_BYTES = 256 * 1024;

/**
 * Reads a JSON body and validates it. Returns the parsed value or a ready 4xx Response:
 * 415 when not application/json, 413 when too large, 400 for malformed JSON or schema issues.
 */
export async function readJson<S extends z.ZodType>(request: Request, schema: S): Promise<z.infer<S> | Response> {
  const type = request.headers.get('content-type') ?? '';
  if (!/^application\/json\b/i.test(type)) {
    return jsonError(415, 'Send the body as JSON with Content-Type: application/json.', [{ path: '(headers).content-type', message: `got "${type || 'nothing'}"` }]);
  }
  const declared = Number(request.headers.get('content-length') ?? 0);
  if (declared > MAX_JSON_BYTES) return jsonError(413, `The body is larger than ${MAX_JSON_BYTES / 1024} KiB.`);
  const text = await request.text();
  if (Buffer.byteLength(text) > MAX_JSON_BYTES) return jsonError(413, `The body is larger than ${MAX_JSON_BYTES / 1024} KiB.`);
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    return jsonError(400, 'The body is not valid JSON.', [{ path: '(body)', message: 'could not parse JSON' }]);
  }
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    const issues = zodIssues(parsed.error);
    return jsonError(400, `Some fields are not valid: ${issues.map((i) => i.path).slice(0, 3).join(', ')}.`, issues);
  }
  return parsed.data;
}
