/** The open calculator endpoints share one shape: rate limit → JSON body through zod → pure computation. */
import type { APIRoute } from 'astro';
import type { z } from 'zod';
import { readJson } from './responses.ts';
import { limitCalculator } from '../services/calc-limit.ts';

export function calcEndpoint<S extends z.ZodType>(schema: S, compute: (body: z.infer<S>) => unknown): APIRoute {
  return async ({ request, clientAddress }) => {
    const limited = await limitCalculator(clientAddress);
    if (limited) return limited;
    const body = await readJson(request, schema);
    if (body instanceof Response) return body;
    return Response.json(compute(body));
  };
}
