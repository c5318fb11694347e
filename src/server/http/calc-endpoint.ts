/** The open calculator endpoints share one shape: rate limit → JSON body through zod → pure computation. */
import type { APIRoute } from 'astro';
import type { z } from 'zod';
import { readJson } from './request.ts';
import { limitCalculator } from '../services/calc-limit.ts';

export function calcEndpoint<S extends z.ZodType>(schema: S, compute: (body: z.infer<S>) => unknown): APIRoute {
  return async ({ request, clientAddress }) => {
    limitCalculator(clientAddress);
    return Response.json(compute(await readJson(request, schema)));
  };
}
