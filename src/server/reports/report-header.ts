/** The header stamped on every report page once the page count is known. */
import { drawTextRuns, faceHasChars, type FontFace, measureText } from './fonts.ts';
import { DRAFT_MARK } from '../../lib/bom.ts';
import { COPPER, INK, MARGIN_PT, MUTED, PAGE_HEIGHT_PT, PAGE_WIDTH_PT, type ReportLayout } from './report-layout.ts';

export interface HeaderInfo {
  designName: string;
  revision: number;
  /** ISO date, YYYY-MM-DD. */
  generatedDate: string;
  /** A design that is not ready: every page says "Draft — not verified". */
  draft?: boolean;
}

export const REPORT_HEADING = 'Stallpoint design report';

/** Shortens text with an ellipsis until it fits. */
function fitText(face: FontFace, text: string, sizePt: number, widthPt: number): string {
  if (measureText(face, text, sizePt) <= widthPt) return text;
  let cut = text;
  while (cut.length > 1 && measureText(face, `${cut}…`, sizePt) > widthPt) cut = cut.slice(0, -1);
  return `${cut}…`;
}

/** Product line and page x of y, then design name and revision with date, over a copper rule. */
export function stampHeaders(layout: ReportLayout, info: HeaderInfo): void {
  const { regular, bold } = layout.fonts;
  const left = MARGIN_PT;
  const right = PAGE_WIDTH_PT - MARGIN_PT;
  const top = PAGE_HEIGHT_PT - 34;
  const meta = `Rev ${info.revision} · generated ${info.generatedDate}`;
  const name = fitText(bold, info.designName, 10.5, right - left - measureText(regular, meta, 9) - 24);
  layout.pages.forEach((page, i) => {
    const pageText = `Page ${i + 1} of ${layout.pages.length}`;
    drawTextRuns(page, bold, REPORT_HEADING, { x: left, y: top, sizePt: 9, color: MUTED });
    if (info.draft) {
      const mark = `✕ ${DRAFT_MARK}`;
      const face = bold;
      const text = faceHasChars(face, '✕') ? mark : DRAFT_MARK;
      drawTextRuns(page, face, text, { x: (left + right - measureText(face, text, 9)) / 2, y: top, sizePt: 9, color: INK });
    }
    drawTextRuns(page, regular, pageText, { x: right - measureText(regular, pageText, 9), y: top, sizePt: 9, color: MUTED });
    drawTextRuns(page, bold, name, { x: left, y: top - 14, sizePt: 10.5, color: INK });
    drawTextRuns(page, regular, meta, { x: right - measureText(regular, meta, 9), y: top - 14, sizePt: 9, color: INK });
    page.drawLine({ start: { x: left, y: top - 22 }, end: { x: right, y: top - 22 }, thickness: 0.9, color: COPPER });
  });
}
