import type { APIRoute } from 'astro';
import { db } from '../../../server/db.ts';
import { inviteBody } from '../../../server/auth/schemas.ts';
import { invitePerson, listPeople } from '../../../server/services/people.ts';
import { publicBaseUrl } from '../../../server/mail/config.ts';
import { readJson, signedInUser } from '../../../server/http/request.ts';

/** GET → {people}: everyone with roles and status (admins only, see policy). */
export const GET: APIRoute = async () => {
  return Response.json({ people: await listPeople(db()) }, { headers: { 'Cache-Control': 'no-store' } });
};

/** POST {email, name, roles} → 201 {person, mailSent}: invites by e-mail with a single-use 72 h link. */
export const POST: APIRoute = async (context) => {
  const body = await readJson(context.request, inviteBody);
  const outcome = await invitePerson(db(), body, signedInUser(context.locals), publicBaseUrl(context.url.origin));
  return Response.json(outcome, { status: 201, headers: { 'Cache-Control': 'no-store' } });
};
