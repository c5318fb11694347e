/** CSV export of any filtered list, in the import format (services/parts-csv.ts). */
import { db } from '../db.ts';
import { toCsv } from '../../lib/csv.ts';
import type { ScopedPartQuery } from '../repos/part-search.ts';
import { loadPartsByIds } from '../repos/part-writes.ts';
import { CSV_COLUMNS, partToCsvRow } from './parts-csv.ts';
import { matchingIds } from './parts-search.ts';

export const MAX_EXPORT_ROWS = 5000;

export async function exportPartsCsv(query: ScopedPartQuery): Promise<{ csv: string; fileName: string; rows: number }> {
  const ids = (await matchingIds(query)).slice(0, MAX_EXPORT_ROWS);
  const rows: Record<string, string>[] = [];
  for (let i = 0; i < ids.length; i += 200) {
    for (const part of await loadPartsByIds(db(), ids.slice(i, i + 200))) rows.push(partToCsvRow(part));
  }
  // toCsv guards formula-leading cells with an apostrophe; the import (parts-csv.ts) restores the text.
  const csv = toCsv(
    CSV_COLUMNS,
    rows.map((r) => CSV_COLUMNS.map((c) => r[c])),
  );
  const fileName = `stallpoint-parts${query.category ? `-${query.category}` : ''}-${new Date().toISOString().slice(0, 10)}.csv`;
  return { csv, fileName, rows: rows.length };
}
