/** The one issue list of the error shape: zod issues with dotted paths like "motor.noLoadCurrentA". */
import type { z } from 'zod';

export interface ApiIssue {
  path: string;
  message: string;
}

export function issuesOf(error: z.ZodError, emptyPath = '(body)'): ApiIssue[] {
  return error.issues.map((issue) => ({ path: issue.path.map(String).join('.') || emptyPath, message: issue.message }));
}
