import type { APIRoute } from 'astro';
import { readJson } from '../../../server/http/responses.ts';
import { partInputSchema, partListQuerySchema } from '../../../lib/schemas/parts.ts';
import { answer, readQuery } from '../../../server/services/errors.ts';
import { requireUser } from '../../../server/services/parts-access.ts';
import { searchParts } from '../../../server/services/parts-search.ts';
import { csvResponse, exportPartsCsv } from '../../../server/services/parts-export.ts';
import { createPart } from '../../../server/services/parts.ts';

/** GET /api/parts: filtered, sorted, paged list → { items, total, page, pageSize }; format=csv exports. */
export const GET: APIRoute = ({ url, locals }) =>
  answer(async () => {
    requireUser(locals.user);
    const query = readQuery(url, partListQuerySchema);
    if (query.format === 'csv') return csvResponse(await exportPartsCsv(query));
    return Response.json(await searchParts(query), { headers: { 'Cache-Control': 'no-store' } });
  });

/** POST /api/parts: a librarian adds a part; a designer proposes one (pending review). */
export const POST: APIRoute = ({ request, locals }) =>
  answer(async () => {
    requireUser(locals.user);
    const body = await readJson(request, partInputSchema);
    if (body instanceof Response) return body;
    return Response.json(await createPart(locals.user, body), { status: 201 });
  });
