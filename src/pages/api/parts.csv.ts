import type { APIRoute } from 'astro';
import { partListQuerySchema } from '../../lib/schemas/parts.ts';
import { exportPartsCsv } from '../../server/services/parts-export.ts';
import { csvDownload } from '../../server/http/downloads.ts';
import { readQuery } from '../../server/http/request.ts';
import { listingScope } from '../../server/services/parts-access.ts';
import { expandQueryText } from '../../lib/query-units.ts';

/** GET /api/parts.csv?…the list filters: every matching part in the import format (units in `q` read as /api/parts does). */
export const GET: APIRoute = async ({ url, locals }) => {
  const read = new URL(url);
  read.search = expandQueryText(url.searchParams).params.toString();
  return csvDownload(await exportPartsCsv({ ...readQuery(read, partListQuerySchema), ...listingScope(locals.user) }));
};
