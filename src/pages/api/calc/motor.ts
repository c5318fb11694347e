import { calcEndpoint } from '../../../server/http/calc-endpoint.ts';
import { calcMotorRequestSchema } from '../../../lib/schemas/calc.ts';
import { calcMotor } from '../../../lib/calc.ts';

/** POST /api/calc/motor: the linear model from datasheet points, re-scaled to a supply [api-contract.md]. */
export const POST = calcEndpoint(calcMotorRequestSchema, calcMotor);
