import type { APIRoute } from 'astro';
import { partListQuerySchema } from '../../lib/schemas/parts.ts';
import { exportPartsCsv } from '../../server/services/parts-export.ts';
import { csvDownload } from '../../server/http/downloads.ts';
import { readQuery } from '../../server/http/request.ts';
import { listingScope } from '../../server/services/parts-access.ts';

/** GET /api/parts.csv?…the list filters: every matching part in the import format. */
export const GET: APIRoute = async ({ url, locals }) => {
  return csvDownload(await exportPartsCsv({ ...readQuery(url, partListQuerySchema), ...listingScope(locals.user) }));
};
