import type { APIRoute } from 'astro';
import { z } from 'zod';
import { readCsvBody, readQuery, signedInUser } from '../../server/http/request.ts';
import { ServiceError } from '../../server/services/errors.ts';
import { commitImport, IDEMPOTENCY_KEY_PATTERN, MAX_IMPORT_BYTES, previewImport } from '../../server/services/imports.ts';

const importQuerySchema = z.strictObject({ mode: z.enum(['preview', 'commit'], { error: 'mode is preview or commit' }) });

/**
 * POST /api/imports?mode=preview|commit (text/csv body; commit needs an Idempotency-Key header).
 * Librarians only (the policy). A refused commit answers 400 with the whole report beside the issues.
 */
export const POST: APIRoute = async ({ url, request, locals }) => {
  const user = signedInUser(locals);
  const { mode } = readQuery(url, importQuerySchema);
  if (mode === 'preview') return Response.json(await previewImport(await readCsvBody(request, MAX_IMPORT_BYTES)));
  const key = request.headers.get('idempotency-key') ?? '';
  if (!IDEMPOTENCY_KEY_PATTERN.test(key)) {
    throw new ServiceError(400, 'A commit needs an Idempotency-Key header (8–100 letters, digits, _ . : -).', [
      { path: '(headers).idempotency-key', message: key ? 'not a valid key' : 'missing' },
    ]);
  }
  const result = await commitImport(user, await readCsvBody(request, MAX_IMPORT_BYTES), key);
  return Response.json(result, { status: result.replayed ? 200 : 201 });
};
