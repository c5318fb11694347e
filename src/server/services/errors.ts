/**
 * Refusals the services raise (bad input, not found, conflicts, limits). Plain data, no HTTP objects:
 * the one error mapping in src/server/http/error-response.ts turns them into responses.
 */
import type { ApiIssue } from '../../lib/schemas/issues.ts';

export type RefusalStatus = 400 | 401 | 403 | 404 | 409 | 413 | 415 | 429 | 503;

export class ServiceError extends Error {
  constructor(
    readonly status: RefusalStatus,
    message: string,
    readonly issues: ApiIssue[] = [],
    /** Extra response headers (Retry-After on 429). */
    readonly headers: Record<string, string> = {},
    /** Extra fields for the error body beside {error, issues} (an import's report). */
    readonly details: Record<string, unknown> = {},
  ) {
    super(message);
    this.name = 'ServiceError';
  }
}

export const notFound = (what: string): ServiceError => new ServiceError(404, `${what} was not found.`);

export const staleVersion = (current: number): ServiceError =>
  new ServiceError(409, 'Someone changed this part after you loaded it. Reload to see their change, then apply yours again.', [
    { path: 'version', message: `the part is now at version ${current}` },
  ]);
