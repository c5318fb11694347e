/**
 * Request readers for API routes. Each one returns the parsed value or throws a ServiceError (400, 401,
 * 404, 413, 415); the middleware answers it in the one error shape. Routes read:
 * parse → service → Response.json, with no try/catch.
 */
import type { z } from 'zod';
import type { SessionUser } from '../auth/types.ts';
import { issuesOf } from '../../lib/schemas/issues.ts';
import { notFound, ServiceError } from '../services/errors.ts';

export const MAX_JSON_BYTES = 256 * 1024;

/** The signed-in person; the policy already refused anonymous callers, so this is a guard, not a rule. */
export function signedInUser(locals: { user: SessionUser | null }): SessionUser {
  if (!locals.user) throw new ServiceError(401, 'Sign in first.');
  return locals.user;
}

/** A positive integer id from a route parameter, or a 404 (an id that cannot exist names nothing). */
export function routeId(raw: string | undefined, what = 'The part'): number {
  const id = Number(raw);
  if (!raw || !/^\d{1,10}$/.test(raw) || !Number.isSafeInteger(id) || id < 1) throw notFound(what);
  return id;
}

/** Validates URL search parameters with a schema; 400 naming every wrong parameter. */
export function readQuery<S extends z.ZodType>(url: URL, schema: S): z.infer<S> {
  const raw: Record<string, string> = {};
  for (const [k, v] of url.searchParams.entries()) raw[k] = v;
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    const issues = issuesOf(parsed.error, '(query)');
    throw new ServiceError(
      400,
      `Some search parameters are not valid: ${issues
        .map((i) => i.path)
        .slice(0, 3)
        .join(', ')}.`,
      issues,
    );
  }
  return parsed.data;
}

function contentType(request: Request): string {
  return request.headers.get('content-type') ?? '';
}

function wrongType(expected: string, got: string): ServiceError {
  return new ServiceError(415, expected, [{ path: '(headers).content-type', message: `got "${got || 'nothing'}"` }]);
}

/**
 * Reads the body with a hard byte cap enforced while it streams in (with or without Content-Length):
 * the reader stops as soon as the cap is passed, so an oversized body is never buffered whole.
 */
export async function readCappedBody(request: Request, limitBytes: number, tooLarge: () => ServiceError): Promise<Uint8Array<ArrayBuffer>> {
  const declared = Number(request.headers.get('content-length') ?? 0);
  if (declared > limitBytes) throw tooLarge();
  if (!request.body) return new Uint8Array(0);
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let received = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    received += value.byteLength;
    if (received > limitBytes) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge();
    }
    chunks.push(value);
  }
  const body = new Uint8Array(received);
  let offset = 0;
  for (const c of chunks) {
    body.set(c, offset);
    offset += c.byteLength;
  }
  return body;
}

function utf8(bytes: Uint8Array, what: string): string {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw new ServiceError(400, `The ${what} is not UTF-8 text.`, [{ path: '(body)', message: 'save it as UTF-8' }]);
  }
}

/**
 * Reads a JSON body and validates it: 415 when not application/json, 413 when over 256 KiB (counted
 * while streaming), 400 for malformed JSON or schema issues naming each field.
 */
export async function readJson<S extends z.ZodType>(request: Request, schema: S): Promise<z.infer<S>> {
  const type = contentType(request);
  if (!/^application\/json\b/i.test(type)) throw wrongType('Send the body as JSON with Content-Type: application/json.', type);
  const tooLarge = () =>
    new ServiceError(413, `The body is larger than ${MAX_JSON_BYTES / 1024} KiB.`, [
      { path: '(body)', message: `at most ${MAX_JSON_BYTES} bytes` },
    ]);
  const text = utf8(await readCappedBody(request, MAX_JSON_BYTES, tooLarge), 'body');
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    throw new ServiceError(400, 'The body is not valid JSON.', [{ path: '(body)', message: 'could not parse JSON' }]);
  }
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    const issues = issuesOf(parsed.error);
    throw new ServiceError(
      400,
      `Some fields are not valid: ${issues
        .map((i) => i.path)
        .slice(0, 3)
        .join(', ')}.`,
      issues,
    );
  }
  return parsed.data;
}

/** A text/csv (or text/plain) body as UTF-8 text, capped at `limitBytes`. */
export async function readCsvBody(request: Request, limitBytes: number): Promise<string> {
  const type = contentType(request);
  if (!/^text\/(csv|plain)\b/i.test(type)) throw wrongType('Send the CSV file as the body with Content-Type: text/csv.', type);
  const tooLarge = () =>
    new ServiceError(413, `The CSV file is larger than ${Math.round(limitBytes / 1024 / 1024)} MB.`, [
      { path: '(body)', message: `at most ${limitBytes} bytes` },
    ]);
  return utf8(await readCappedBody(request, limitBytes, tooLarge), 'CSV file');
}

/** Room for the multipart envelope (boundaries, part headers, the revision field) beyond the file itself. */
export const MULTIPART_OVERHEAD_BYTES = 64 * 1024;

export interface UploadedFile {
  name: string;
  bytes: Uint8Array;
  fields: Record<string, string>;
}

/**
 * Parses a multipart upload, capped while it streams in (file limit + envelope), and returns the file
 * in `field` and the text fields. Only the bounded body is handed to the web FormData parser.
 */
export async function readMultipartFile(request: Request, field: string, fileLimitBytes: number): Promise<UploadedFile> {
  const type = contentType(request);
  if (!/^multipart\/form-data\b/i.test(type)) throw wrongType('Send the file as multipart/form-data.', type);
  const tooLarge = () =>
    new ServiceError(413, `The file is larger than ${Math.round(fileLimitBytes / 1024 / 1024)} MB.`, [
      { path: field, message: `at most ${fileLimitBytes} bytes` },
    ]);
  const body = await readCappedBody(request, fileLimitBytes + MULTIPART_OVERHEAD_BYTES, tooLarge);
  let form: FormData;
  try {
    form = await new Response(body, { headers: { 'content-type': type } }).formData();
  } catch {
    throw new ServiceError(400, 'The upload is not valid multipart form data.', [{ path: '(body)', message: 'could not parse the form' }]);
  }
  const file = form.get(field);
  if (!file || typeof file === 'string')
    throw new ServiceError(400, `Attach the file in the form field "${field}".`, [{ path: field, message: 'no file' }]);
  const fields: Record<string, string> = {};
  for (const [k, v] of form.entries()) if (typeof v === 'string') fields[k] = v;
  return { name: file.name, bytes: new Uint8Array(await file.arrayBuffer()), fields };
}
