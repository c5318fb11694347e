import type { APIRoute } from 'astro';
import { attachmentDisposition, datasheetFile, removeDatasheet } from '../../../server/services/datasheets.ts';
import { routeId, signedInUser } from '../../../server/http/request.ts';

/** GET /api/datasheets/:id: the PDF as a download (never rendered inline, never sniffed). */
export const GET: APIRoute = async ({ params }) => {
  const file = await datasheetFile(routeId(params.id, 'The datasheet'));
  return new Response(file.bytes as Uint8Array<ArrayBuffer>, {
    headers: {
      'Content-Type': 'application/pdf',
      'Content-Disposition': attachmentDisposition(file.name),
      'Content-Length': String(file.bytes.byteLength),
      'X-Content-Type-Options': 'nosniff',
      'Cache-Control': 'private, no-store',
    },
  });
};

/** DELETE /api/datasheets/:id: librarians remove a datasheet (record and file). */
export const DELETE: APIRoute = async ({ params, locals }) => {
  await removeDatasheet(signedInUser(locals), routeId(params.id, 'The datasheet'));
  return new Response(null, { status: 204 });
};
