import type { APIRoute } from 'astro';
import { partInputSchema, partListQuerySchema } from '../../../lib/schemas/parts.ts';
import { searchParts } from '../../../server/services/parts-search.ts';
import { exportPartsCsv } from '../../../server/services/parts-export.ts';
import { csvDownload } from '../../../server/http/downloads.ts';
import { createPart } from '../../../server/services/parts.ts';
import { listingScope } from '../../../server/services/parts-access.ts';
import { readJson, readQuery, signedInUser } from '../../../server/http/request.ts';
import { expandQueryText } from '../../../lib/query-units.ts';
import { filterChips } from '../../../lib/filter-chips.ts';

/**
 * GET /api/parts: filtered, sorted, paged list → { items, total, page, pageSize, understood }; units in
 * `q` become filters (`understood` says which; `units=off` keeps the text as it is); format=csv exports.
 */
export const GET: APIRoute = async ({ url, locals }) => {
  const { params, understood } = expandQueryText(url.searchParams);
  const query = { ...readQuery(withParams(url, params), partListQuerySchema), ...listingScope(locals.user) };
  if (query.format === 'csv') return csvDownload(await exportPartsCsv(query));
  const chips = filterChips(new URLSearchParams(understood as Record<string, string>));
  return Response.json(
    { ...(await searchParts(query)), understood: { filters: understood, chips, q: query.q ?? null } },
    { headers: { 'Cache-Control': 'no-store' } },
  );
};

function withParams(url: URL, params: URLSearchParams): URL {
  const out = new URL(url);
  out.search = params.toString();
  return out;
}

/** POST /api/parts: a librarian adds a part; a designer proposes one (pending review). */
export const POST: APIRoute = async ({ request, locals }) => {
  const user = signedInUser(locals);
  const body = await readJson(request, partInputSchema);
  return Response.json(await createPart(user, body), { status: 201 });
};
