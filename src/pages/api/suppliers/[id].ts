import type { APIRoute } from 'astro';
import { supplierContactInputSchema } from '../../../lib/schemas/quotes.ts';
import { changeSupplierContact } from '../../../server/services/quotes.ts';
import { readJson, routeId, signedInUser } from '../../../server/http/request.ts';

/** PUT {name, company, email} → {contact}. */
export const PUT: APIRoute = async ({ params, request, locals }) => {
  const user = signedInUser(locals);
  const id = routeId(params.id, 'The supplier contact');
  const body = await readJson(request, supplierContactInputSchema);
  return Response.json(await changeSupplierContact(user, id, body));
};
