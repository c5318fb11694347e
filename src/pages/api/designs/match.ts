import type { APIRoute } from 'astro';
import { z } from 'zod';
import { designInputSchema } from '../../../lib/schemas/design.ts';
import { matchInput } from '../../../server/services/designs.ts';
import { readJson } from '../../../server/http/request.ts';

const body = z.object({ includePending: z.boolean().default(false), input: designInputSchema });

/** POST /api/designs/match: rank candidates for an unsaved design (the new-design workspace). */
export const POST: APIRoute = async ({ request }) => {
  const parsed = await readJson(request, body);
  return Response.json(await matchInput(parsed.input, parsed.includePending));
};
