import type { APIRoute } from 'astro';
import { answer, routeId } from '../../../server/services/errors.ts';
import { attachmentDisposition, datasheetFile, removeDatasheet } from '../../../server/services/datasheets.ts';

/** GET /api/datasheets/:id: the PDF as a download (never rendered inline, never sniffed). */
export const GET: APIRoute = ({ params, locals }) =>
  answer(async () => {
    const file = await datasheetFile(locals.user, routeId(params.id, 'The datasheet'));
    return new Response(file.bytes as Uint8Array<ArrayBuffer>, {
      headers: {
        'Content-Type': 'application/pdf',
        'Content-Disposition': attachmentDisposition(file.name),
        'Content-Length': String(file.bytes.byteLength),
        'X-Content-Type-Options': 'nosniff',
        'Cache-Control': 'private, no-store',
      },
    });
  });

/** DELETE /api/datasheets/:id: librarians remove a datasheet (record and file). */
export const DELETE: APIRoute = ({ params, locals }) =>
  answer(async () => {
    await removeDatasheet(locals.user, routeId(params.id, 'The datasheet'));
    return new Response(null, { status: 204 });
  });
