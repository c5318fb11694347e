import type { APIRoute } from 'astro';
import { readJson } from '../../../server/http/responses.ts';
import { db } from '../../../server/db.ts';
import { tokenPasswordBody } from '../../../server/auth/schemas.ts';
import { resetPassword } from '../../../server/services/people-accounts.ts';
import { serviceErrorResponse } from '../../../server/services/errors.ts';

/** POST {token, password}: sets the new password once; every session of the person ends. */
export const POST: APIRoute = async (context) => {
  const body = await readJson(context.request, tokenPasswordBody);
  if (body instanceof Response) return body;
  try {
    await resetPassword(db(), body.token, body.password);
    return Response.json({ changed: true }, { headers: { 'Cache-Control': 'no-store' } });
  } catch (err) {
    return serviceErrorResponse(err);
  }
};
