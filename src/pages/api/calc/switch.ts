import type { APIRoute } from 'astro';
import { readJson } from '../../../server/http/responses.ts';
import { calcSwitchRequestSchema } from '../../../lib/schemas/calc.ts';
import { calcSwitch } from '../../../lib/calc.ts';
import { limitCalculator } from '../../../server/services/calc-limit.ts';

/** POST /api/calc/switch: one MOSFET against one operating case [api-contract.md]. */
export const POST: APIRoute = async ({ request, clientAddress }) => {
  const limited = await limitCalculator(clientAddress);
  if (limited) return limited;
  const body = await readJson(request, calcSwitchRequestSchema);
  if (body instanceof Response) return body;
  return Response.json(calcSwitch(body));
};
