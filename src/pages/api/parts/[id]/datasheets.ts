import type { APIRoute } from 'astro';
import { answer, routeId } from '../../../../server/services/errors.ts';
import { requireThat, canCurate } from '../../../../server/services/parts-access.ts';
import { readMultipartFile } from '../../../../server/services/datasheets-multipart.ts';
import { addDatasheet, MAX_DATASHEET_BYTES } from '../../../../server/services/datasheets.ts';

/** POST /api/parts/:id/datasheets (multipart: file, revision): librarians attach a PDF. */
export const POST: APIRoute = ({ params, request, locals }) =>
  answer(async () => {
    requireThat(locals.user, canCurate, 'add datasheets');
    const id = routeId(params.id);
    const upload = await readMultipartFile(request, 'file', MAX_DATASHEET_BYTES);
    const sheet = await addDatasheet(locals.user, id, { name: upload.name, bytes: upload.bytes, revision: upload.fields.revision ?? '' });
    return Response.json(sheet, { status: 201 });
  });
