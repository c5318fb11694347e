import type { APIRoute } from 'astro';
import { buildQuantities } from '../../lib/shortlist-figures.ts';
import { shortlistCsvFile } from '../../server/services/shortlist.ts';
import { ServiceError } from '../../server/services/errors.ts';
import { csvDownload } from '../../server/http/downloads.ts';

/** GET ?boards-<designId>=<boards> → text/csv: the shortlist's lines, figures, totals and rate dates at those build quantities. */
export const GET: APIRoute = async ({ url, locals }) => {
  const { boards, issues } = buildQuantities(url.searchParams);
  if (issues.length) throw new ServiceError(400, `Some build quantities are not valid: ${issues.map((i) => i.path).join(', ')}.`, issues);
  return csvDownload(await shortlistCsvFile(locals.user ?? null, boards));
};
