import type { APIRoute } from 'astro';
import { supplierContactInputSchema } from '../../../lib/schemas/quotes.ts';
import { addSupplierContact, supplierContacts } from '../../../server/services/quotes.ts';
import { readJson, signedInUser } from '../../../server/http/request.ts';

/** GET → {contacts}: the supplier contacts buyers send requests for quotation to. */
export const GET: APIRoute = async () => Response.json({ contacts: await supplierContacts() });

/** POST {name, company, email} → 201 {contact}. */
export const POST: APIRoute = async ({ request, locals }) => {
  const user = signedInUser(locals);
  const body = await readJson(request, supplierContactInputSchema);
  return Response.json(await addSupplierContact(user, body), { status: 201 });
};
