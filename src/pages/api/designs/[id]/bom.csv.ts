import type { APIRoute } from 'astro';
import { z } from 'zod';
import { designOutputs, bomFileName, bomToCsv } from '../../../../server/services/design-outputs.ts';
import { readQuery, routeId } from '../../../../server/http/request.ts';

const query = z.object({ revision: z.coerce.number().int().min(1).optional() });

/** GET /api/designs/:id/bom.csv: line, role, quantity, maker, part number, alternates, designators, status; a draft's first row says so. */
export const GET: APIRoute = async ({ params, url }) => {
  const id = routeId(params.id, 'The design');
  const { revision } = readQuery(url, query);
  const out = await designOutputs(id, revision);
  return new Response('\uFEFF' + bomToCsv(out.bom, out.draft), {
    headers: {
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': `attachment; filename="${bomFileName(out.design, 'csv')}"`,
      'Cache-Control': 'no-store',
    },
  });
};
