/** Download responses (CSV, PDF) built from what a service returns: the HTTP side stays here. */

/** A CSV attachment; X-Row-Count says how many data rows it holds. */
export function csvDownload(result: { csv: string; fileName: string; rows: number }): Response {
  return new Response(result.csv, {
    headers: {
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': `attachment; filename="${result.fileName}"`,
      'Cache-Control': 'no-store',
      'X-Row-Count': String(result.rows),
    },
  });
}
