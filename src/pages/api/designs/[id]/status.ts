import type { APIRoute } from 'astro';
import { z } from 'zod';
import { readJson, jsonError } from '../../../../server/http/responses.ts';
import { setDesignStatus } from '../../../../server/services/design-status.ts';
import { answer, routeId } from '../../../../server/services/errors.ts';

const body = z.object({ status: z.enum(['draft', 'ready']), version: z.number().int().min(1) });

/** POST /api/designs/:id/status: mark ready (its lines go on the buyer's shortlist) or back to draft. */
export const POST: APIRoute = ({ params, request, locals }) =>
  answer(async () => {
    if (!locals.user) return jsonError(401, 'Sign in first.');
    const id = routeId(params.id, 'The design');
    const parsed = await readJson(request, body);
    if (parsed instanceof Response) return parsed;
    return Response.json(await setDesignStatus(locals.user, id, parsed.status, parsed.version));
  });
