import type { APIRoute } from 'astro';
import { buildQuantities } from '../../lib/shortlist-figures.ts';
import { readyShortlist } from '../../server/services/shortlist.ts';
import { ServiceError } from '../../server/services/errors.ts';

/** GET ?boards-<designId>=<boards> → {designs, withdrawn}: the ready designs' buying figures at those build quantities. */
export const GET: APIRoute = async ({ url, locals }) => {
  const { boards, issues } = buildQuantities(url.searchParams);
  if (issues.length) throw new ServiceError(400, `Some build quantities are not valid: ${issues.map((i) => i.path).join(', ')}.`, issues);
  return Response.json(await readyShortlist(locals.user ?? null, boards));
};
