import type { APIRoute } from 'astro';
import { currencyRateInputSchema } from '../../lib/schemas/rates.ts';
import { currencyRates, setCurrencyRate } from '../../server/services/currency-rates.ts';
import { readJson, signedInUser } from '../../server/http/request.ts';

/** GET → {orgCurrency, rates}: the rates the shortlist converts with. */
export const GET: APIRoute = async () => Response.json(await currencyRates());

/** PUT {currency, rateToOrg, asOf} → {rate}: an admin sets one currency's rate. */
export const PUT: APIRoute = async ({ request, locals }) => {
  const user = signedInUser(locals);
  const body = await readJson(request, currencyRateInputSchema);
  return Response.json({ rate: await setCurrencyRate(user, body) });
};
