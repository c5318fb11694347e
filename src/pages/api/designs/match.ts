import type { APIRoute } from 'astro';
import { z } from 'zod';
import { readJson } from '../../../server/http/responses.ts';
import { designInputSchema } from '../../../lib/schemas/design.ts';
import { matchInput } from '../../../server/services/designs.ts';
import { answer } from '../../../server/services/errors.ts';
import type { DesignInput } from '../../../lib/domain/design.ts';

const body = z.object({ includePending: z.boolean().default(false), input: designInputSchema });

/** POST /api/designs/match: rank candidates for an unsaved design (the new-design workspace). */
export const POST: APIRoute = ({ request }) =>
  answer(async () => {
    const parsed = await readJson(request, body);
    if (parsed instanceof Response) return parsed;
    return Response.json(await matchInput(parsed.input as DesignInput, parsed.includePending));
  });
