/** Download responses (CSV, PDF) built from what a service returns: the HTTP side stays here. */

/** A CSV attachment (a whole text, or a stream sent as it is read); X-Row-Count says how many data rows it holds. */
export function csvDownload(result: { body: string | ReadableStream<Uint8Array>; fileName: string; rows: number }): Response {
  return new Response(result.body, {
    headers: {
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': `attachment; filename="${result.fileName}"`,
      'Cache-Control': 'no-store',
      'X-Row-Count': String(result.rows),
    },
  });
}
