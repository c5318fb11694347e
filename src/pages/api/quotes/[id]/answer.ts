import type { APIRoute } from 'astro';
import { quoteAnswerInputSchema } from '../../../../lib/schemas/quotes.ts';
import { answerQuoteRequest } from '../../../../server/services/quotes.ts';
import { readJson, routeId, signedInUser } from '../../../../server/http/request.ts';

/** POST {lines: [{lineId, unitPrice, currency, moq, leadTimeDays, validUntil}]} → {quote}: sent → answered; 409 from any other state. */
export const POST: APIRoute = async ({ params, request, locals }) => {
  const user = signedInUser(locals);
  const id = routeId(params.id, 'The quote request');
  const body = await readJson(request, quoteAnswerInputSchema);
  return Response.json(await answerQuoteRequest(user, id, body));
};
