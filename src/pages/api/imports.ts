import type { APIRoute } from 'astro';
import { z } from 'zod';
import { answer, readQuery, ServiceError } from '../../server/services/errors.ts';
import { canCurate, requireThat } from '../../server/services/parts-access.ts';
import { readCappedBody } from '../../server/services/datasheets-multipart.ts';
import { commitImport, IDEMPOTENCY_KEY_PATTERN, ImportRefused, MAX_IMPORT_BYTES, previewImport } from '../../server/services/imports.ts';

const importQuerySchema = z.strictObject({ mode: z.enum(['preview', 'commit'], { error: 'mode is preview or commit' }) });

async function readCsv(request: Request): Promise<string> {
  const type = request.headers.get('content-type') ?? '';
  if (!/^text\/(csv|plain)\b/i.test(type)) {
    throw new ServiceError(415, 'Send the CSV file as the body with Content-Type: text/csv.', [{ path: '(headers).content-type', message: `got "${type || 'nothing'}"` }]);
  }
  const bytes = await readCappedBody(request, MAX_IMPORT_BYTES);
  if (bytes.byteLength > MAX_IMPORT_BYTES) throw new ServiceError(413, 'The CSV file is larger than 2 MB.', [{ path: '(body)', message: `at most ${MAX_IMPORT_BYTES} bytes` }]);
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw new ServiceError(400, 'The CSV file is not UTF-8 text.', [{ path: '(body)', message: 'save it as UTF-8' }]);
  }
}

/** POST /api/imports?mode=preview|commit (text/csv body; commit needs an Idempotency-Key header). */
export const POST: APIRoute = ({ url, request, locals }) =>
  answer(async () => {
    requireThat(locals.user, canCurate, 'import parts');
    const { mode } = readQuery(url, importQuerySchema);
    if (mode === 'preview') return Response.json(await previewImport(locals.user, await readCsv(request)));
    const key = request.headers.get('idempotency-key') ?? '';
    if (!IDEMPOTENCY_KEY_PATTERN.test(key)) {
      throw new ServiceError(400, 'A commit needs an Idempotency-Key header (8–100 letters, digits, _ . : -).', [{ path: '(headers).idempotency-key', message: key ? 'not a valid key' : 'missing' }]);
    }
    try {
      const result = await commitImport(locals.user, await readCsv(request), key);
      return Response.json(result, { status: result.replayed ? 200 : 201 });
    } catch (err) {
      if (err instanceof ImportRefused) return Response.json({ error: err.message, issues: err.issues, ...err.report }, { status: 400 });
      throw err;
    }
  });
