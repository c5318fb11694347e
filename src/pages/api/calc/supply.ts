import { calcEndpoint } from '../../../server/http/calc-endpoint.ts';
import { calcSupplyRequestSchema } from '../../../lib/schemas/calc.ts';
import { calcSupply } from '../../../lib/supply.ts';

/** POST /api/calc/supply: can the source start the motor, and does a shared controller survive the start [api-contract.md]. */
export const POST = calcEndpoint(calcSupplyRequestSchema, calcSupply);
