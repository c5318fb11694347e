/** Ruled tables for the report: cells wrap, rows never split, the header repeats on each new page. */
import { HAIRLINE, INK, type ReportLayout, SHADE } from './report-layout.ts';

export interface TableColumn {
  title: string;
  /** Share of the content width; the shares of a table add up to 1. */
  widthFraction: number;
  align?: 'left' | 'right';
}

export interface TableOptions {
  sizePt?: number;
  /** Optional per-row style: bold rows mark the chosen part. */
  boldRows?: ReadonlySet<number>;
}

const PAD_X_PT = 3;
const PAD_Y_PT = 3;

interface CellGrid {
  xs: number[];
  widths: number[];
}

function gridOf(layout: ReportLayout, columns: readonly TableColumn[]): CellGrid {
  const widths = columns.map((c) => c.widthFraction * layout.widthPt);
  const xs: number[] = [];
  widths.reduce((x, w) => (xs.push(x), x + w), layout.left);
  return { xs, widths };
}

function drawRow(
  layout: ReportLayout,
  grid: CellGrid,
  columns: readonly TableColumn[],
  cells: string[][],
  style: { sizePt: number; bold: boolean; shaded: boolean },
): void {
  const lineHeight = style.sizePt * 1.25;
  const rowHeight = rowHeightOf(cells, style.sizePt);
  const top = layout.y;
  if (style.shaded)
    layout.page.drawRectangle({ x: layout.left, y: top - rowHeight, width: layout.widthPt, height: rowHeight, color: SHADE });
  cells.forEach((lines, i) => {
    lines.forEach((line, j) => {
      const baseline = top - PAD_Y_PT - style.sizePt - j * lineHeight + 1;
      const textWidth = layout.measure(line, { sizePt: style.sizePt, bold: style.bold });
      const x = columns[i].align === 'right' ? grid.xs[i] + grid.widths[i] - PAD_X_PT - textWidth : grid.xs[i] + PAD_X_PT;
      layout.textAt(line, x, baseline, { sizePt: style.sizePt, bold: style.bold, color: INK });
    });
  });
  layout.y = top - rowHeight;
  layout.page.drawLine({
    start: { x: layout.left, y: layout.y },
    end: { x: layout.left + layout.widthPt, y: layout.y },
    thickness: 0.5,
    color: HAIRLINE,
  });
}

function wrapCells(layout: ReportLayout, grid: CellGrid, row: readonly string[], sizePt: number, bold: boolean): string[][] {
  return row.map((text, i) => layout.wrap(text, grid.widths[i] - 2 * PAD_X_PT, { sizePt, bold }));
}

function rowHeightOf(cells: string[][], sizePt: number): number {
  return Math.max(...cells.map((c) => c.length)) * sizePt * 1.25 + 2 * PAD_Y_PT;
}

/** Height the table would take if drawn on one page. */
export function tableHeightPt(
  layout: ReportLayout,
  columns: readonly TableColumn[],
  rows: readonly (readonly string[])[],
  options: TableOptions = {},
): number {
  const sizePt = options.sizePt ?? 8;
  const grid = gridOf(layout, columns);
  return [columns.map((c) => c.title), ...rows].reduce(
    (h, row, i) => h + rowHeightOf(wrapCells(layout, grid, row, sizePt, i === 0), sizePt),
    0,
  );
}

export function drawTable(
  layout: ReportLayout,
  columns: readonly TableColumn[],
  rows: readonly (readonly string[])[],
  options: TableOptions = {},
): void {
  const sizePt = options.sizePt ?? 8;
  const grid = gridOf(layout, columns);
  const header = wrapCells(
    layout,
    grid,
    columns.map((c) => c.title),
    sizePt,
    true,
  );
  const headerHeight = rowHeightOf(header, sizePt);
  const drawHeader = (): void => drawRow(layout, grid, columns, header, { sizePt, bold: true, shaded: true });
  const wrapped = rows.map((r, i) => wrapCells(layout, grid, r, sizePt, options.boldRows?.has(i) ?? false));
  layout.ensureSpace(headerHeight + (wrapped[0] ? rowHeightOf(wrapped[0], sizePt) : 0));
  drawHeader();
  wrapped.forEach((cells, i) => {
    if (layout.ensureSpace(rowHeightOf(cells, sizePt))) drawHeader();
    drawRow(layout, grid, columns, cells, { sizePt, bold: options.boldRows?.has(i) ?? false, shaded: false });
  });
  layout.gap(6);
}
