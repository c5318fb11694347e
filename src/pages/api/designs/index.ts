import type { APIRoute } from 'astro';
import { z } from 'zod';
import { designInputSchema } from '../../../lib/schemas/design.ts';
import { createDesign, listDesigns } from '../../../server/services/designs.ts';
import { readJson, readQuery, signedInUser } from '../../../server/http/request.ts';

const listQuery = z.object({
  q: z.string().trim().max(120).optional(),
  status: z.enum(['draft', 'ready']).optional(),
  mine: z.enum(['1', '0']).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});

/** GET /api/designs: list with search; anyone signed in may read designs. */
export const GET: APIRoute = async ({ url, locals }) => {
  const q = readQuery(url, listQuery);
  const ownerId = q.mine === '1' ? signedInUser(locals).id : undefined;
  return Response.json(await listDesigns({ q: q.q, status: q.status, ownerId, page: q.page, pageSize: q.pageSize }));
};

/** POST /api/designs: a designer creates a design (revision 1). */
export const POST: APIRoute = async ({ request, locals }) => {
  const user = signedInUser(locals);
  const body = await readJson(request, designInputSchema);
  return Response.json(await createDesign(user, body), { status: 201 });
};
