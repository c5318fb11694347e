import type { APIRoute } from 'astro';
import { partListQuerySchema } from '../../lib/schemas/parts.ts';
import { answer, readQuery } from '../../server/services/errors.ts';
import { requireUser } from '../../server/services/parts-access.ts';
import { csvResponse, exportPartsCsv } from '../../server/services/parts-export.ts';

/** GET /api/parts.csv?…the list filters: every matching part in the import format. */
export const GET: APIRoute = ({ url, locals }) =>
  answer(async () => {
    requireUser(locals.user);
    return csvResponse(await exportPartsCsv(readQuery(url, partListQuerySchema)));
  });
