/** Refusals the services raise (bad input, not found, conflicts, limits), and their translation into the one error shape. */
import { jsonError, type ApiIssue } from '../http/responses.ts';
import { issuesOf } from '../../lib/schemas/issues.ts';

export class ServiceError extends Error {
  constructor(
    readonly status: 400 | 401 | 403 | 404 | 409 | 413 | 415 | 429,
    message: string,
    readonly issues: ApiIssue[] = [],
  ) {
    super(message);
  }
}

export const notFound = (what: string): ServiceError => new ServiceError(404, `${what} was not found.`);

export const staleVersion = (current: number): ServiceError =>
  new ServiceError(409, 'Someone changed this part after you loaded it. Reload to see their change, then apply yours again.', [
    { path: 'version', message: `the part is now at version ${current}` },
  ]);

/** ServiceError → its response; anything else is a bug and is rethrown (the server answers 500). */
export function serviceErrorResponse(err: unknown): Response {
  if (err instanceof ServiceError) return jsonError(err.status, err.message, err.issues);
  throw err;
}

/** Runs an endpoint body and answers refusals in the one error shape. */
export async function answer(run: () => Promise<Response>): Promise<Response> {
  try {
    return await run();
  } catch (err) {
    return serviceErrorResponse(err);
  }
}

/** A positive integer id from a route parameter, or a 404 (an id that cannot exist names nothing). */
export function routeId(raw: string | undefined, what = 'The part'): number {
  const id = Number(raw);
  if (!raw || !/^\d{1,10}$/.test(raw) || !Number.isSafeInteger(id) || id < 1) throw notFound(what);
  return id;
}

/** Validates URL search parameters with a schema; 400 naming every wrong parameter. */
export function readQuery<S extends import('zod').ZodType>(url: URL, schema: S): import('zod').infer<S> {
  const raw: Record<string, string> = {};
  for (const [k, v] of url.searchParams.entries()) raw[k] = v;
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    const issues = issuesOf(parsed.error, '(query)');
    throw new ServiceError(400, `Some search parameters are not valid: ${issues.map((i) => i.path).slice(0, 3).join(', ')}.`, issues);
  }
  return parsed.data;
}
