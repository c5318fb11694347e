/**
 * The shortlist as a CSV file, pure: the lines and figures the screen shows, one row per option (chosen
 * part and alternates) and per generic line, then per design its total of the chosen parts, the short
 * lines and the rates used with their dates. The first column says what a row is (line, total, short,
 * rate) so a spreadsheet can filter. Written through the one CSV writer (src/lib/csv.ts), which
 * neutralises cells a spreadsheet would run as formulas (a buyer's note may start with "=").
 * Money to the cent; unit prices and rates as stored; empty cells where the screen shows "—".
 */
import { toCsv, type CsvCell } from './csv.ts';
import { fixed } from './units.ts';
import type { LineFigures, OptionFigures, ShortlistTotals } from './shortlist-figures.ts';

export interface ShortlistCsvDesign {
  id: number;
  name: string;
  revision: number;
  boards: number;
  attritionPct: number;
  lines: LineFigures[];
  totals: ShortlistTotals;
}

export const SHORTLIST_CSV_HEADER = [
  'row',
  'design_id',
  'design',
  'revision',
  'boards',
  'attrition_pct',
  'line',
  'option',
  'manufacturer',
  'part_number',
  'need',
  'distributor',
  'sku',
  'preferred_by',
  'order_qty',
  'break_qty',
  'unit_price',
  'currency',
  'extended',
  'converted',
  'org_currency',
  'stock',
  'shortfall',
  'lead_time_days',
  'moq',
  'order_multiple',
  'lifecycle',
  'check',
  'note',
] as const;

const money = (v: number | null | undefined): string => (v === null || v === undefined ? '' : fixed(v, 2));

function optionRow(d: ShortlistCsvDesign, l: LineFigures, o: OptionFigures): CsvCell[] {
  const q = o.quote;
  return [
    'line',
    d.id,
    d.name,
    d.revision,
    d.boards,
    d.attritionPct,
    l.label,
    o.position === 0 ? 'chosen' : `alternate ${o.position}`,
    o.manufacturer,
    o.mpn,
    l.need,
    q?.source.distributor,
    q?.source.sku,
    o.preferredApplied ? (o.preference?.setByName ?? 'a buyer no longer listed') : '',
    q?.orderQty,
    q?.breakQty,
    q?.unitPrice,
    q?.source.currency,
    money(q?.extendedCost),
    money(q?.converted?.amount),
    d.totals.orgCurrency,
    o.stockQty,
    o.shortfall,
    q?.source.leadTimeDays,
    q?.source.moq,
    q?.source.orderMultiple,
    o.lifecycle,
    o.status,
    o.preference?.note,
  ];
}

/** A row with the design columns filled, the given columns set by header name. */
function designRow(d: ShortlistCsvDesign, kind: string, cells: Partial<Record<(typeof SHORTLIST_CSV_HEADER)[number], CsvCell>>): CsvCell[] {
  const base: Record<string, CsvCell> = {
    row: kind,
    design_id: d.id,
    design: d.name,
    revision: d.revision,
    boards: d.boards,
    attrition_pct: d.attritionPct,
    ...cells,
  };
  return SHORTLIST_CSV_HEADER.map((h) => base[h]);
}

export function shortlistRows(designs: readonly ShortlistCsvDesign[]): CsvCell[][] {
  return designs.flatMap((d) => [
    ...d.lines.flatMap((l) =>
      l.options.length === 0
        ? [
            designRow(d, 'line', {
              line: l.label,
              option: 'generic',
              part_number: l.generic,
              need: l.need,
              check: 'not in the catalogue: not priced',
            }),
          ]
        : l.options.map((o) => optionRow(d, l, o)),
    ),
    designRow(d, 'total', {
      line: 'Total of the chosen parts',
      converted: money(d.totals.totalOrg),
      org_currency: d.totals.orgCurrency,
      note: d.totals.unpriced.length ? `Not in the total: ${d.totals.unpriced.join(', ')}` : '',
    }),
    ...d.totals.short.map((label) => designRow(d, 'short', { line: label, check: `short at ${d.boards} boards` })),
    ...d.totals.ratesUsed.map((r) =>
      designRow(d, 'rate', {
        currency: r.currency,
        unit_price: r.rateToOrg,
        org_currency: d.totals.orgCurrency,
        note: `rate of ${r.asOf}`,
      }),
    ),
  ]);
}

export function shortlistCsv(designs: readonly ShortlistCsvDesign[]): { csv: string; rows: number } {
  const rows = shortlistRows(designs);
  return { csv: toCsv(SHORTLIST_CSV_HEADER, rows), rows: rows.length };
}
