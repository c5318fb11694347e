/**
 * Reads a multipart upload with a hard byte cap enforced while the body streams in: the reader stops
 * and the request is refused as soon as the cap is passed, so an oversized upload is never buffered whole.
 * Only then is the (bounded) body handed to the web FormData parser.
 */
import { ServiceError } from './errors.ts';

/** Room for the multipart envelope (boundaries, part headers, the revision field) beyond the file itself. */
export const MULTIPART_OVERHEAD_BYTES = 64 * 1024;

function tooLarge(limitBytes: number): ServiceError {
  return new ServiceError(413, `The file is larger than ${Math.round(limitBytes / 1024 / 1024)} MB.`, [{ path: 'file', message: `at most ${limitBytes} bytes` }]);
}

export async function readCappedBody(request: Request, fileLimitBytes: number): Promise<Uint8Array<ArrayBuffer>> {
  const limit = fileLimitBytes + MULTIPART_OVERHEAD_BYTES;
  const declared = Number(request.headers.get('content-length') ?? 0);
  if (declared > limit) throw tooLarge(fileLimitBytes);
  if (!request.body) return new Uint8Array(0);
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let received = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    received += value.byteLength;
    if (received > limit) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge(fileLimitBytes);
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

export interface UploadedFile {
  name: string;
  bytes: Uint8Array;
  fields: Record<string, string>;
}

/** Parses a bounded multipart body and returns the file in `field` and the text fields. */
export async function readMultipartFile(request: Request, field: string, fileLimitBytes: number): Promise<UploadedFile> {
  const type = request.headers.get('content-type') ?? '';
  if (!/^multipart\/form-data\b/i.test(type)) {
    throw new ServiceError(415, 'Send the file as multipart/form-data.', [{ path: '(headers).content-type', message: `got "${type || 'nothing'}"` }]);
  }
  const body = await readCappedBody(request, fileLimitBytes);
  let form: FormData;
  try {
    form = await new Response(body as Uint8Array<ArrayBuffer>, { headers: { 'content-type': type } }).formData();
  } catch {
    throw new ServiceError(400, 'The upload is not valid multipart form data.', [{ path: '(body)', message: 'could not parse the form' }]);
  }
  const file = form.get(field);
  if (!file || typeof file === 'string') throw new ServiceError(400, `Attach the file in the form field "${field}".`, [{ path: field, message: 'no file' }]);
  const fields: Record<string, string> = {};
  for (const [k, v] of form.entries()) if (typeof v === 'string') fields[k] = v;
  return { name: file.name, bytes: new Uint8Array(await file.arrayBuffer()), fields };
}
