/** The one error shape: {"error": sentence, "issues": [{path, message}]}. Request readers: ./request.ts. */
import type { z } from 'zod';
import { issuesOf, type ApiIssue } from '../../lib/schemas/issues.ts';

export type { ApiIssue };

export function jsonError(status: number, error: string, issues: ApiIssue[] = [], headers: Record<string, string> = {}): Response {
  return Response.json({ error, issues }, { status, headers: { 'Cache-Control': 'no-store', ...headers } });
}

export const zodIssues = (error: z.ZodError): ApiIssue[] => issuesOf(error);
