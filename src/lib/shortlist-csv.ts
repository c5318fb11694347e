/**
 * The shortlist as a CSV file, pure: the lines and figures the screen shows, one row per option (chosen
 * part and alternates) and per generic line, each option followed by its cached distributor offers
 * (row "offer": that distributor's stock, price at the need and lead time, with when it was fetched and
 * the error of the last fetch when it failed, the figure kept), then per design its total of the chosen parts, the short
 * lines and the rates used with their dates. The first column says what a row is (line, offer, total,
 * short, rate) so a spreadsheet can filter. Written through the one CSV writer (src/lib/csv.ts), which
 * neutralises cells a spreadsheet would run as formulas (a buyer's note may start with "=").
 * Money to the cent; unit prices and rates as stored; empty cells where the screen shows "—".
 */
import { toCsv, type CsvCell } from './csv.ts';
import { fixed } from './units.ts';
import type { LineFigures, OptionFigures, ShortlistTotals } from './shortlist-figures.ts';
import type { CachedOfferFigures } from './cached-offer-figures.ts';

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
  'fetched_at',
  'fetch_error',
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
    '',
    '',
  ];
}

/** A cached distributor offer of an option: its own stock and price at the line's need, not in the total. */
function offerRow(d: ShortlistCsvDesign, l: LineFigures, o: OptionFigures, f: CachedOfferFigures): CsvCell[] {
  return designRow(d, 'offer', {
    line: l.label,
    option: o.position === 0 ? 'chosen' : `alternate ${o.position}`,
    manufacturer: o.manufacturer,
    part_number: o.mpn,
    need: l.need,
    distributor: f.distributor,
    sku: f.sku,
    order_qty: f.orderQty,
    break_qty: f.breakQty,
    unit_price: f.unitPrice,
    currency: f.currency,
    extended: money(f.extendedCost),
    stock: f.stockQty,
    shortfall: f.shortfall,
    lead_time_days: f.leadTimeDays,
    moq: f.moq,
    check: 'cached distributor offer: not in the total',
    fetched_at: f.fetchedAt,
    fetch_error: f.lastError,
  });
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
        : l.options.flatMap((o) => [optionRow(d, l, o), ...o.distributorOffers.map((f) => offerRow(d, l, o, f))]),
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
