import { calcEndpoint } from '../../../server/http/calc-endpoint.ts';
import { calcSwitchRequestSchema } from '../../../lib/schemas/calc.ts';
import { calcSwitch } from '../../../lib/calc.ts';

/** POST /api/calc/switch: one MOSFET against one operating case [api-contract.md]. */
export const POST = calcEndpoint(calcSwitchRequestSchema, calcSwitch);
