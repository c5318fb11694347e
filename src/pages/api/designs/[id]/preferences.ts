import type { APIRoute } from 'astro';
import { shortlistPreferenceInputSchema } from '../../../../lib/schemas/shortlist.ts';
import { setShortlistPreference } from '../../../../server/services/shortlist-preferences.ts';
import { readJson, routeId, signedInUser } from '../../../../server/http/request.ts';

/** PUT /api/designs/:id/preferences {line, partId, sourceId, note} → {preference}: a buyer's preferred source and note for one option. */
export const PUT: APIRoute = async ({ params, request, locals }) => {
  const user = signedInUser(locals);
  const id = routeId(params.id, 'The design');
  const body = await readJson(request, shortlistPreferenceInputSchema);
  return Response.json(await setShortlistPreference(user, id, body));
};
