import type { APIRoute } from 'astro';
import { quoteRequestInputSchema } from '../../../lib/schemas/quotes.ts';
import { quoteRequests, sendQuoteRequest } from '../../../server/services/quotes.ts';
import { readJson, signedInUser } from '../../../server/http/request.ts';

/** GET → {quotes}: every request for quotation, newest first. */
export const GET: APIRoute = async () => Response.json({ quotes: await quoteRequests() });

/**
 * POST {contactId, idempotencyKey, wantedBy, notes, lines: [{designId, line, partId, quantityNeeded, orderQuantity, notes}]}
 * → 201 {quote, repeated: false}, or 200 {quote, repeated: true} when that key was sent before (no second mail).
 */
export const POST: APIRoute = async ({ request, locals }) => {
  const user = signedInUser(locals);
  const body = await readJson(request, quoteRequestInputSchema);
  const out = await sendQuoteRequest(user, body);
  return Response.json(out, { status: out.repeated ? 200 : 201 });
};
