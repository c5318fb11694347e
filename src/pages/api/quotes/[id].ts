import type { APIRoute } from 'astro';
import { quoteRequest } from '../../../server/services/quotes.ts';
import { routeId } from '../../../server/http/request.ts';

/** GET → {quote}: one request for quotation with its lines and answers. */
export const GET: APIRoute = async ({ params }) => {
  const id = routeId(params.id, 'The quote request');
  return Response.json({ quote: await quoteRequest(id) });
};
