/**
 * CSV export of any filtered list, in the import format (services/parts-csv.ts): every matching part,
 * streamed. The ids of the matching parts are read once, in the list's order, with one statement (a few
 * hundred kB even for a catalogue of tens of thousands); the parts are then loaded by primary key, 500 at
 * a time, and written as CSV chunks while the client reads, so memory stays at one chunk whatever the
 * size. Parts deleted while the file is being sent are left out; nothing is cut at any count.
 */
import { db } from '../db.ts';
import { toCsvLines } from '../../lib/csv.ts';
import type { ScopedPartQuery } from '../repos/part-search.ts';
import { loadPartsByIds } from '../repos/part-writes.ts';
import { CSV_COLUMNS, partToCsvRow } from './parts-csv.ts';
import { matchingIds } from './parts-search.ts';

/** Parts loaded and written per CSV chunk. */
export const EXPORT_CHUNK_ROWS = 500;

export interface CsvExport {
  /** The file: header line, then the parts chunk by chunk (UTF-8, CRLF line ends). */
  body: ReadableStream<Uint8Array>;
  fileName: string;
  /** Parts matching when the export began. */
  rows: number;
}

export async function exportPartsCsv(query: ScopedPartQuery): Promise<CsvExport> {
  const ids = await matchingIds(query);
  const encoder = new TextEncoder();
  let next = 0;
  // toCsvLines (the one CSV writer) guards formula-leading cells with an apostrophe; the import
  // (parts-csv.ts) restores the text.
  const body = new ReadableStream<Uint8Array>({
    start(controller) {
      controller.enqueue(encoder.encode(toCsvLines([CSV_COLUMNS])));
    },
    // Called when the client has taken the previous chunk: one chunk in memory at a time.
    async pull(controller) {
      if (next >= ids.length) {
        controller.close();
        return;
      }
      const chunk = ids.slice(next, next + EXPORT_CHUNK_ROWS);
      next += chunk.length;
      const rows = (await loadPartsByIds(db(), chunk)).map((part) => {
        const row = partToCsvRow(part);
        return CSV_COLUMNS.map((c) => row[c]);
      });
      controller.enqueue(encoder.encode(toCsvLines(rows)));
    },
  });
  const fileName = `stallpoint-parts${query.category ? `-${query.category}` : ''}-${new Date().toISOString().slice(0, 10)}.csv`;
  return { body, fileName, rows: ids.length };
}
