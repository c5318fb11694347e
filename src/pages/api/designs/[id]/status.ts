import type { APIRoute } from 'astro';
import { z } from 'zod';
import { INT_UNSIGNED_MAX } from '../../../../lib/schemas/bounds.ts';
import { setDesignStatus } from '../../../../server/services/design-status.ts';
import { readJson, routeId, signedInUser } from '../../../../server/http/request.ts';

const body = z.object({ status: z.enum(['draft', 'ready']), version: z.number().int().min(1).max(INT_UNSIGNED_MAX) });

/** POST /api/designs/:id/status: mark ready (its lines go on the buyer's shortlist) or back to draft. */
export const POST: APIRoute = async ({ params, request, locals }) => {
  const user = signedInUser(locals);
  const id = routeId(params.id, 'The design');
  const parsed = await readJson(request, body);
  return Response.json(await setDesignStatus(user, id, parsed.status, parsed.version));
};
