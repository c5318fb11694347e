/**
 * A small flowing layout for A4 reports: a cursor that moves down the page, ensureSpace() that starts a
 * new page when a block would not fit, and text wrapped by measured width. Headers are stamped by
 * report-header.ts at the end, once the page count is known.
 */
import { type Color, type PDFDocument, type PDFPage, rgb } from 'pdf-lib';
import { drawTextRuns, type FontFace, type FontPair, measureText } from './fonts.ts';

/** A4 portrait in points (210 × 297 mm at 72 pt per inch). */
export const PAGE_WIDTH_PT = 595.28;
export const PAGE_HEIGHT_PT = 841.89;
export const MARGIN_PT = 48;
/** Content starts below the header that report-header.ts stamps on every page. */
const CONTENT_TOP_PT = PAGE_HEIGHT_PT - 78;

export const INK = rgb(0.16, 0.17, 0.19); // graphite
export const MUTED = rgb(0.42, 0.44, 0.47);
export const HAIRLINE = rgb(0.8, 0.81, 0.83);
export const SHADE = rgb(0.95, 0.95, 0.96);
export const COPPER = rgb(0.72, 0.42, 0.2);

export interface TextStyle {
  sizePt?: number;
  bold?: boolean;
  color?: Color;
}

const lineHeightOf = (sizePt: number): number => sizePt * 1.32;

export class ReportLayout {
  readonly pages: PDFPage[] = [];
  page!: PDFPage;
  y = CONTENT_TOP_PT;
  readonly left = MARGIN_PT;
  readonly widthPt = PAGE_WIDTH_PT - 2 * MARGIN_PT;

  constructor(
    readonly pdf: PDFDocument,
    readonly fonts: FontPair,
  ) {
    this.newPage();
  }

  newPage(): void {
    this.page = this.pdf.addPage([PAGE_WIDTH_PT, PAGE_HEIGHT_PT]);
    this.pages.push(this.page);
    this.y = CONTENT_TOP_PT;
  }

  /** Starts a new page unless `heightPt` still fits above the bottom margin; true when it did. */
  ensureSpace(heightPt: number): boolean {
    if (this.y - heightPt >= MARGIN_PT) return false;
    this.newPage();
    return true;
  }

  gap(heightPt: number): void {
    this.y -= heightPt;
  }

  face(style: TextStyle = {}): FontFace {
    return style.bold ? this.fonts.bold : this.fonts.regular;
  }

  measure(text: string, style: TextStyle = {}): number {
    return measureText(this.face(style), text, style.sizePt ?? 9);
  }

  /** Draws one line with its baseline at y (no cursor movement). */
  textAt(text: string, x: number, y: number, style: TextStyle = {}): void {
    drawTextRuns(this.page, this.face(style), text, { x, y, sizePt: style.sizePt ?? 9, color: style.color ?? INK });
  }

  /** Greedy word wrap by measured width; words longer than a line are cut by characters. */
  wrap(text: string, widthPt: number, style: TextStyle = {}): string[] {
    const lines: string[] = [];
    let line = '';
    for (const word of text.split(/\s+/).filter(Boolean)) {
      const candidate = line ? `${line} ${word}` : word;
      if (this.measure(candidate, style) <= widthPt) line = candidate;
      else {
        if (line) lines.push(line);
        line = this.cutLongWord(word, widthPt, style, lines);
      }
    }
    if (line || lines.length === 0) lines.push(line);
    return lines;
  }

  private cutLongWord(word: string, widthPt: number, style: TextStyle, lines: string[]): string {
    let rest = word;
    while (this.measure(rest, style) > widthPt && rest.length > 1) {
      let n = rest.length - 1;
      while (n > 1 && this.measure(rest.slice(0, n), style) > widthPt) n--;
      lines.push(rest.slice(0, n));
      rest = rest.slice(n);
    }
    return rest;
  }

  /** Wrapped text that flows across pages (or stays on one page with keepTogether), starting at the cursor. */
  paragraph(text: string, style: TextStyle & { indentPt?: number; keepTogether?: boolean } = {}): void {
    const sizePt = style.sizePt ?? 9;
    const indent = style.indentPt ?? 0;
    const lines = this.wrap(text, this.widthPt - indent, style);
    if (style.keepTogether) this.ensureSpace(lines.length * lineHeightOf(sizePt));
    for (const line of lines) {
      this.ensureSpace(lineHeightOf(sizePt));
      this.y -= sizePt;
      this.textAt(line, this.left + indent, this.y, style);
      this.y -= lineHeightOf(sizePt) - sizePt;
    }
  }

  /** Section title with a copper rule; keeps at least `keepWithPt` of room below it on the same page. */
  heading(title: string, keepWithPt = 60): void {
    if (!this.ensureSpace(46 + keepWithPt)) this.y -= 12;
    this.y -= 14;
    this.textAt(title, this.left, this.y, { sizePt: 13, bold: true });
    this.y -= 6;
    this.page.drawLine({ start: { x: this.left, y: this.y }, end: { x: this.left + 36, y: this.y }, thickness: 1.6, color: COPPER });
    this.y -= 12;
  }

  subheading(title: string, keepWithPt = 40): void {
    if (!this.ensureSpace(26 + keepWithPt)) this.y -= 6;
    this.y -= 10.5;
    this.textAt(title, this.left, this.y, { sizePt: 10.5, bold: true });
    this.y -= 6;
  }

  /** A list item with a hanging indent. */
  bullet(text: string, style: TextStyle = {}): void {
    const sizePt = style.sizePt ?? 9;
    this.ensureSpace(lineHeightOf(sizePt));
    this.textAt('–', this.left + 2, this.y - sizePt, { ...style, color: MUTED });
    this.paragraph(text, { ...style, indentPt: 12 });
  }

  /** Label–value pairs in two columns; values wrap. */
  keyValues(rows: readonly [string, string][], labelWidthPt = 124): void {
    const valueWidth = this.widthPt - labelWidthPt;
    for (const [label, value] of rows) {
      const lines = this.wrap(value, valueWidth);
      this.ensureSpace(lines.length * lineHeightOf(9) + 2);
      this.y -= 9;
      this.textAt(label, this.left, this.y, { color: MUTED });
      lines.forEach((line, i) => this.textAt(line, this.left + labelWidthPt, this.y - i * lineHeightOf(9)));
      this.y -= (lines.length - 1) * lineHeightOf(9) + lineHeightOf(9) - 9 + 2;
    }
  }
}
