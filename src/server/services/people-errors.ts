/** A refusal a people service can give, mapped to the one error shape by the endpoints. */
import { jsonError, type ApiIssue } from '../http/responses.ts';

export class PeopleError extends Error {
  constructor(readonly status: 400 | 404 | 409 | 429, message: string, readonly issues: ApiIssue[] = []) {
    super(message);
  }
}

/** The error Response for a PeopleError; anything else is re-thrown (a real fault, not bad input). */
export function peopleErrorResponse(err: unknown): Response {
  if (err instanceof PeopleError) return jsonError(err.status, err.message, err.issues);
  throw err;
}
