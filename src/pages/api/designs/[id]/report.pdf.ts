import type { APIRoute } from 'astro';
import { z } from 'zod';
import { designOutputs, bomFileName } from '../../../../server/services/design-outputs.ts';
import { buildDesignReportPdf } from '../../../../server/reports/design-report.ts';
import { readQuery, routeId } from '../../../../server/http/request.ts';

const query = z.object({ revision: z.coerce.number().int().min(1).optional() });

/** GET /api/designs/:id/report.pdf (?revision=n): the design report with every check, for review and sign-off. */
export const GET: APIRoute = async ({ params, url }) => {
  const id = routeId(params.id, 'The design');
  const { revision } = readQuery(url, query);
  const out = await designOutputs(id, revision);
  const pdf = await buildDesignReportPdf({
    design: {
      id: out.design.id,
      name: out.design.name,
      revision: out.design.revision,
      ownerName: out.design.ownerName,
      status: out.design.status,
      generatedAt: new Date(),
    },
    input: out.design.input,
    match: out.match,
    bom: out.bom,
    partsById: out.partsById,
    readiness: out.readiness,
    draft: out.draft,
  });
  return new Response(Buffer.from(pdf), {
    headers: {
      'Content-Type': 'application/pdf',
      'Content-Disposition': `attachment; filename="${bomFileName(out.design, 'pdf')}"`,
      'Cache-Control': 'no-store',
    },
  });
};
