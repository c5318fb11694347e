import { calcEndpoint } from '../../../server/http/calc-endpoint.ts';
import { calcPullResistorRequestSchema } from '../../../lib/schemas/calc.ts';
import { calcPullResistor } from '../../../lib/calc.ts';

/** POST /api/calc/pull-resistor: size an external pull against a pin's internal pull [api-contract.md]. */
export const POST = calcEndpoint(calcPullResistorRequestSchema, calcPullResistor);
