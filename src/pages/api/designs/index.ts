import type { APIRoute } from 'astro';
import { z } from 'zod';
import { readJson, jsonError } from '../../../server/http/responses.ts';
import { designInputSchema } from '../../../lib/schemas/design.ts';
import { createDesign, listDesigns } from '../../../server/services/designs.ts';
import { answer, readQuery } from '../../../server/services/errors.ts';
import type { DesignInput } from '../../../lib/domain/design.ts';

const listQuery = z.object({
  q: z.string().trim().max(120).optional(),
  status: z.enum(['draft', 'ready']).optional(),
  mine: z.enum(['1', '0']).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});

/** GET /api/designs: list with search; anyone signed in may read designs. */
export const GET: APIRoute = ({ url, locals }) =>
  answer(async () => {
    const q = readQuery(url, listQuery);
    const ownerId = q.mine === '1' ? locals.user?.id : undefined;
    return Response.json(await listDesigns({ q: q.q, status: q.status, ownerId, page: q.page, pageSize: q.pageSize }));
  });

/** POST /api/designs: a designer creates a design (revision 1). */
export const POST: APIRoute = ({ request, locals }) =>
  answer(async () => {
    if (!locals.user) return jsonError(401, 'Sign in first.');
    const body = await readJson(request, designInputSchema);
    if (body instanceof Response) return body;
    return Response.json(await createDesign(locals.user, body as DesignInput), { status: 201 });
  });
