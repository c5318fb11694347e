import type { APIRoute } from 'astro';
import { z } from 'zod';
import { designInputSchema } from '../../../../lib/schemas/design.ts';
import { getDesign, matchInput } from '../../../../server/services/designs.ts';
import { readJson, routeId } from '../../../../server/http/request.ts';

const body = z.object({
  includePending: z.boolean().default(false),
  /** Unsaved input to rank instead of the saved revision (the workspace re-ranks while you type). */
  input: designInputSchema.optional(),
});

/** POST /api/designs/:id/match: ranked switch, driver and diode candidates with reasons, best first. */
export const POST: APIRoute = async ({ params, request }) => {
  const id = routeId(params.id, 'The design');
  const parsed = await readJson(request, body);
  const input = parsed.input ?? (await getDesign(id)).input;
  return Response.json(await matchInput(input, parsed.includePending));
};
