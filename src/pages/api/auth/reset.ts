import type { APIRoute } from 'astro';
import { db } from '../../../server/db.ts';
import { tokenPasswordBody } from '../../../server/auth/schemas.ts';
import { resetPassword } from '../../../server/services/people-accounts.ts';
import { readJson } from '../../../server/http/request.ts';

/** POST {token, password}: sets the new password once; every session of the person ends. */
export const POST: APIRoute = async (context) => {
  const body = await readJson(context.request, tokenPasswordBody);
  await resetPassword(db(), { ...body, clientAddress: context.clientAddress });
  return Response.json({ changed: true }, { headers: { 'Cache-Control': 'no-store' } });
};
