import type { APIRoute } from 'astro';
import { db } from '../../../server/db.ts';
import { resetRequestBody } from '../../../server/auth/schemas.ts';
import { requestPasswordReset } from '../../../server/services/people-accounts.ts';
import { publicBaseUrl } from '../../../server/mail/config.ts';
import { readJson } from '../../../server/http/request.ts';

/** POST {email}: always 202 with the same words, whether or not the address is known (ASVS 5.0 V6.3.8). */
export const POST: APIRoute = async (context) => {
  const body = await readJson(context.request, resetRequestBody);
  await requestPasswordReset(db(), body.email, publicBaseUrl(context.url.origin));
  return Response.json(
    { message: 'If this address belongs to a Stallpoint account, a reset link is on its way. It works for 30 minutes.' },
    { status: 202, headers: { 'Cache-Control': 'no-store' } },
  );
};
