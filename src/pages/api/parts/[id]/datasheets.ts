import type { APIRoute } from 'astro';
import { addDatasheet, MAX_DATASHEET_BYTES } from '../../../../server/services/datasheets.ts';
import { routeId, readMultipartFile, signedInUser } from '../../../../server/http/request.ts';

/**
 * POST /api/parts/:id/datasheets (multipart: file, revision, confirm): librarians attach a PDF (roles: the
 * policy). 409 with `confirmation` when its text does not fit the part; confirm=true attaches it anyway.
 */
export const POST: APIRoute = async ({ params, request, locals }) => {
  const user = signedInUser(locals);
  const id = routeId(params.id);
  const upload = await readMultipartFile(request, 'file', MAX_DATASHEET_BYTES);
  const sheet = await addDatasheet(user, id, {
    name: upload.name,
    bytes: upload.bytes,
    revision: upload.fields.revision ?? '',
    confirm: upload.fields.confirm,
  });
  return Response.json(sheet, { status: 201 });
};
