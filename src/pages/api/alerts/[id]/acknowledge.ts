import type { APIRoute } from 'astro';
import { acknowledgeAlert } from '../../../../server/services/design-alerts.ts';
import { routeId, signedInUser } from '../../../../server/http/request.ts';

/** POST /api/alerts/:id/acknowledge: anyone signed in; records who and when (row and audit trail). */
export const POST: APIRoute = async ({ params, locals }) => {
  const user = signedInUser(locals);
  const id = routeId(params.id);
  return Response.json(await acknowledgeAlert(user, id));
};
