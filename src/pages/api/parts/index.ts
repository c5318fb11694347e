import type { APIRoute } from 'astro';
import { partInputSchema, partListQuerySchema } from '../../../lib/schemas/parts.ts';
import { searchParts } from '../../../server/services/parts-search.ts';
import { exportPartsCsv } from '../../../server/services/parts-export.ts';
import { csvDownload } from '../../../server/http/downloads.ts';
import { createPart } from '../../../server/services/parts.ts';
import { listingScope } from '../../../server/services/parts-access.ts';
import { readJson, readQuery, signedInUser } from '../../../server/http/request.ts';

/** GET /api/parts: filtered, sorted, paged list → { items, total, page, pageSize }; format=csv exports. */
export const GET: APIRoute = async ({ url, locals }) => {
  const query = { ...readQuery(url, partListQuerySchema), ...listingScope(locals.user) };
  if (query.format === 'csv') return csvDownload(await exportPartsCsv(query));
  return Response.json(await searchParts(query), { headers: { 'Cache-Control': 'no-store' } });
};

/** POST /api/parts: a librarian adds a part; a designer proposes one (pending review). */
export const POST: APIRoute = async ({ request, locals }) => {
  const user = signedInUser(locals);
  const body = await readJson(request, partInputSchema);
  return Response.json(await createPart(user, body), { status: 201 });
};
