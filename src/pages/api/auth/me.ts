import type { APIRoute } from 'astro';
import { signedInUser } from '../../../server/http/request.ts';

/** The signed-in person (the policy answers 401 for anyone else). */
export const GET: APIRoute = ({ locals }) => {
  const { email, name, roles } = signedInUser(locals);
  return Response.json({ user: { email, name, roles } }, { headers: { 'Cache-Control': 'no-store' } });
};
