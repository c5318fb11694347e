import type { APIRoute } from 'astro';
import { distributorRefreshSchema } from '../../../lib/schemas/distributor.ts';
import { refreshNow } from '../../../server/services/distributor-offers.ts';
import { readJson } from '../../../server/http/request.ts';

/** POST {} → {ran, parts, offersWritten, …, message}: a buyer refreshes the cached distributor offers now. */
export const POST: APIRoute = async ({ request }) => {
  await readJson(request, distributorRefreshSchema);
  return Response.json(await refreshNow());
};
