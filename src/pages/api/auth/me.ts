import type { APIRoute } from 'astro';

/** The signed-in person (the policy answers 401 for anyone else). */
export const GET: APIRoute = ({ locals }) => {
  const { email, name, roles } = locals.user!;
  return Response.json({ user: { email, name, roles } }, { headers: { 'Cache-Control': 'no-store' } });
};
