import type { APIRoute } from 'astro';
import { readJson } from '../../../server/http/responses.ts';
import { calcMotorRequestSchema } from '../../../lib/schemas/calc.ts';
import { calcMotor } from '../../../lib/calc.ts';
import { limitCalculator } from '../../../server/services/calc-limit.ts';

/** POST /api/calc/motor: the linear model from datasheet points, re-scaled to a supply [api-contract.md]. */
export const POST: APIRoute = async ({ request, clientAddress }) => {
  const limited = await limitCalculator(clientAddress);
  if (limited) return limited;
  const body = await readJson(request, calcMotorRequestSchema);
  if (body instanceof Response) return body;
  return Response.json(calcMotor(body));
};
