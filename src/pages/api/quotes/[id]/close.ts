import type { APIRoute } from 'astro';
import { closeQuoteRequest } from '../../../../server/services/quotes.ts';
import { routeId, signedInUser } from '../../../../server/http/request.ts';

/** POST → {quote}: sent or answered → closed; 409 when already closed. */
export const POST: APIRoute = async ({ params, locals }) => {
  const user = signedInUser(locals);
  const id = routeId(params.id, 'The quote request');
  return Response.json(await closeQuoteRequest(user, id));
};
