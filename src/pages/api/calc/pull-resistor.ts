import type { APIRoute } from 'astro';
import { readJson } from '../../../server/http/responses.ts';
import { calcPullResistorRequestSchema } from '../../../lib/schemas/calc.ts';
import { calcPullResistor } from '../../../lib/calc.ts';
import { limitCalculator } from '../../../server/services/calc-limit.ts';

/** POST /api/calc/pull-resistor: size an external pull against a pin's internal pull [api-contract.md]. */
export const POST: APIRoute = async ({ request, clientAddress }) => {
  const limited = await limitCalculator(clientAddress);
  if (limited) return limited;
  const body = await readJson(request, calcPullResistorRequestSchema);
  if (body instanceof Response) return body;
  return Response.json(calcPullResistor(body));
};
