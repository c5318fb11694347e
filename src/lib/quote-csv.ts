/** The CSV attached to a request for quotation, written through the one CSV writer (src/lib/csv.ts). */
import { toCsv } from './csv.ts';

export const QUOTE_CSV_HEADER = ['Line', 'Part number', 'Maker', 'Quantity needed', 'Order quantity', 'Wanted by', 'Notes'] as const;

export interface QuoteCsvLine {
  lineNo: number;
  mpn: string;
  manufacturer: string;
  qtyNeeded: number;
  orderQty: number;
  notes: string | null;
}

/** One row per line; the request's wanted-by date on every row (empty when none). */
export function quoteCsv(lines: readonly QuoteCsvLine[], wantedBy: string | null): string {
  return toCsv(
    QUOTE_CSV_HEADER,
    lines.map((l) => [l.lineNo, l.mpn, l.manufacturer, l.qtyNeeded, l.orderQty, wantedBy ?? '', l.notes ?? '']),
  );
}

export const quoteFileName = (id: number): string => `quote-request-Q-${id}.csv`;
