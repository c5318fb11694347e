/**
 * The design report PDF (GET /api/designs/:id/report.pdf): a design read top to bottom, motor → supply
 * and logic → switch → gate drive → diode → power-on state → bill of materials, then assumptions and
 * cautions. Built with pdf-lib in Source Sans 3; curves are vector paths. Pure apart from reading the
 * shipped font files.
 */
import { PDFDocument } from 'pdf-lib';
import { DRAFT_MARK, draftNotice, type BomLine, type DraftNotice } from '../../lib/bom.ts';
import type { DesignInput, DesignStatus } from '../../lib/domain/design.ts';
import type { Part } from '../../lib/domain/parts.ts';
import type { DesignMatch } from '../../lib/design-match.ts';
import { driverSupplyRangeOf } from '../../lib/design-input.ts';
import { faceHasChars, loadSourceSans } from './fonts.ts';
import { drawAssumptions, drawBom, drawCautions, drawPowerOn } from './report-closing.ts';
import { isoDate, isoMinute, sig, VERDICT_MARKS } from './report-format.ts';
import { drawInputs, drawMotorModel, drawWorstCase } from './report-inputs.ts';
import { stampHeaders } from './report-header.ts';
import { MUTED, ReportLayout } from './report-layout.ts';
import { drawDiodeRole, drawGateDriveRole, drawSwitchRole, type RoleContext } from './report-roles.ts';
import { drawSupply } from './report-supply.ts';

export interface DesignReportData {
  design: { id: number; name: string; revision: number; ownerName: string; status: DesignStatus; generatedAt: Date };
  input: DesignInput;
  match: DesignMatch;
  bom: BomLine[];
  partsById: Map<number, Part>;
  /** The readiness rule at the current catalogue (src/lib/readiness.ts); absent in older callers. */
  readiness?: { issues: { path: string; message: string }[]; acceptedResetStart: string | null };
  /** What a design that is not ready must say (src/lib/bom.ts draftNotice); derived from status and readiness when absent. */
  draft?: DraftNotice | null;
}

/** The draft notice of the report: the caller's, or from the design's status and readiness issues. */
export function reportDraftNotice(data: DesignReportData): DraftNotice | null {
  return data.draft !== undefined ? data.draft : draftNotice(data.design.status, data.readiness?.issues ?? []);
}

export interface DesignReportOptions {
  /** Use the standard Helvetica faces instead of Source Sans 3 (as when the font files are missing). */
  standardFonts?: boolean;
}

export const REPORT_PRODUCER = 'Stallpoint';

export function reportTitle(design: DesignReportData['design']): string {
  return `${design.name} (Rev ${design.revision}): Stallpoint design report`;
}

function drawTitleBlock(layout: ReportLayout, data: DesignReportData): void {
  const d = data.design;
  layout.y -= 20;
  layout.textAt(d.name, layout.left, layout.y, { sizePt: 18, bold: true });
  layout.y -= 8;
  const status = d.status === 'ready' ? 'marked ready' : 'draft';
  layout.paragraph(`Design ${d.id}, revision ${d.revision} (${status}), owned by ${d.ownerName}. Generated ${isoMinute(d.generatedAt)}.`, {
    color: MUTED,
  });
  layout.paragraph(
    `Motor ${data.match.motor.label} on a ${sig(data.input.supply.nomV)} V supply, switched low-side from ${sig(data.input.logic.railV)} V logic.`,
    { color: MUTED },
  );
  const notice = reportDraftNotice(data);
  if (notice) {
    layout.y -= 4;
    layout.paragraph(`${DRAFT_MARK}. ${notice.summary}`, { bold: true, sizePt: 12 });
    if (notice.failing.length) {
      layout.paragraph('Failing picks and checks:', { bold: true });
      notice.failing.forEach((f) => layout.bullet(f));
    }
  }
}

/** Sign-off check: whether the revision holds at the current catalogue, and every reason it does not. */
function drawSignOff(layout: ReportLayout, data: DesignReportData): void {
  const r = data.readiness;
  if (!r) return;
  layout.heading('Sign-off check at the current catalogue');
  if (r.issues.length === 0)
    layout.paragraph(
      '✓ Holds: every chosen part and alternate passes (or is marginal only on margins), all approved, and the motor stays off at reset.',
      { bold: true },
    );
  else {
    layout.paragraph(
      `✕ Does not hold: ${r.issues.length} reason${r.issues.length === 1 ? '' : 's'}. ` +
        `${data.design.status === 'ready' ? 'It is marked ready but will go back to draft on its next check.' : 'It cannot be marked ready until each is resolved.'}`,
      { bold: true },
    );
    r.issues.forEach((i) => layout.bullet(`${i.path}: ${i.message}`));
  }
  if (r.acceptedResetStart)
    layout.paragraph(`The motor may run at power-up or reset; the designer recorded that this is intended: “${r.acceptedResetStart}”`, {
      bold: true,
    });
}

function setMetadata(pdf: PDFDocument, design: DesignReportData['design']): void {
  pdf.setTitle(reportTitle(design), { showInWindowTitleBar: true });
  pdf.setAuthor(design.ownerName);
  pdf.setSubject(`Drive design ${design.id}, revision ${design.revision}`);
  pdf.setKeywords(['Stallpoint', 'design report', 'brushed DC motor drive']);
  pdf.setCreator(REPORT_PRODUCER);
  pdf.setProducer(REPORT_PRODUCER);
  pdf.setCreationDate(design.generatedAt);
  pdf.setModificationDate(design.generatedAt);
}

/** Builds the whole report; long content flows onto further pages, each with the report header. */
export async function buildDesignReportPdf(data: DesignReportData, options: DesignReportOptions = {}): Promise<Uint8Array> {
  const pdf = await PDFDocument.create();
  setMetadata(pdf, data.design);
  const fonts = await loadSourceSans(pdf, { boldWeight: 600, standard: options.standardFonts ?? false });
  const layout = new ReportLayout(pdf, fonts);
  const ctx: RoleContext = {
    match: data.match,
    selections: data.input.selections,
    partsById: data.partsById,
    verdictMarks: faceHasChars(fonts.regular, VERDICT_MARKS) && faceHasChars(fonts.bold, VERDICT_MARKS),
    driverSupplyMinV: driverSupplyRangeOf(data.input).minV,
  };
  drawTitleBlock(layout, data);
  drawSignOff(layout, data);
  drawInputs(layout, data.input, data.match.motor);
  drawMotorModel(layout, data.match.motor);
  drawSupply(layout, data.input, data.match.supply, ctx.verdictMarks);
  drawWorstCase(layout, data.match);
  drawSwitchRole(layout, ctx);
  drawGateDriveRole(layout, ctx);
  drawDiodeRole(layout, ctx);
  drawPowerOn(layout, data.match, data.readiness?.acceptedResetStart ?? null, data.input.resetStartIntent?.reason ?? null);
  drawBom(layout, data.bom);
  drawAssumptions(layout);
  drawCautions(layout, data.match);
  stampHeaders(layout, {
    designName: data.design.name,
    revision: data.design.revision,
    generatedDate: isoDate(data.design.generatedAt),
    draft: reportDraftNotice(data) !== null,
  });
  return pdf.save();
}
