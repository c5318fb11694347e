/**
 * What the report and the bill of materials are made from: one design revision, matched at the current
 * catalogue and judged by the readiness rule, so no line shows a pick as holding when it does not.
 *
 * The match includes parts pending review only when the design picks one: then the report can show that
 * part's checks, marked "pending review — not approved", and the sign-off check refuses it. Otherwise the
 * match is the one marking ready runs (approved parts only), so report, BOM and shortlist agree with it.
 */
import type { Design } from '../../lib/domain/design.ts';
import type { Part } from '../../lib/domain/parts.ts';
import type { DesignMatch } from '../../lib/design-match.ts';
import { buildBom, bomToCsv, draftNotice, type BomLine, type DraftNotice } from '../../lib/bom.ts';
import { bomPairingNotes } from '../../lib/design-words.ts';
import { acceptedResetStart, pickStatus, reviewWords, type ReadinessIssue } from '../../lib/readiness.ts';
import { db } from '../db.ts';
import { getDesign } from './designs.ts';
import { partsByIds } from '../repos/parts.ts';
import { verifyInput } from './design-status.ts';

export interface DesignReadiness {
  /** Empty when the revision holds at the current catalogue. */
  issues: ReadinessIssue[];
  /** The designer's recorded reason when the motor may run at reset and that is intended. */
  acceptedResetStart: string | null;
  /** True when parts pending review were ranked too (the design picks one). */
  includesPending: boolean;
}

export interface DesignOutputs {
  design: Design;
  match: DesignMatch;
  bom: BomLine[];
  partsById: Map<number, Part>;
  readiness: DesignReadiness;
  /** Null when the revision is marked ready and holds; otherwise what every output must say (src/lib/bom.ts). */
  draft: DraftNotice | null;
}

export async function designOutputs(id: number, revision?: number): Promise<DesignOutputs> {
  const design = await getDesign(id, revision);
  const input = design.input;
  const ids = (['switch', 'driver', 'diode'] as const).flatMap((r) => [
    ...(input.selections[r].chosenPartId != null ? [input.selections[r].chosenPartId as number] : []),
    ...input.selections[r].alternatePartIds,
  ]);
  const motorId = input.motor.source === 'catalogue' ? [input.motor.partId] : [];
  const partsById = await partsByIds(db(), [...ids, ...motorId]);
  const includesPending = ids.some((pid) => partsById.get(pid)?.reviewStatus === 'pending');
  const { match, issues, parts } = await verifyInput(input, includesPending);
  const motorPart = input.motor.source === 'catalogue' ? partsById.get(input.motor.partId) : undefined;
  const motorLine = motorPart
    ? { manufacturer: motorPart.manufacturer, mpn: motorPart.mpn, description: motorPart.description }
    : { manufacturer: '(entered by hand)', mpn: match.motor.label, description: 'Motor from datasheet points entered in the design' };
  const motorStatus = motorPart
    ? `${motorPart.lifecycle !== 'obsolete' && motorPart.reviewStatus === 'approved' ? '✓' : '✕'} ${reviewWords(motorPart.reviewStatus)} · ${motorPart.lifecycle}`
    : 'entered by hand';
  const bom = buildBom({
    input,
    motor: motorLine,
    partsById,
    pull: match.powerOn?.recommendedPull ?? null,
    statusOf: (role, partId) => pickStatus(match, role, partId, parts.get(partId)).text,
    motorStatus,
    pairing: bomPairingNotes(match, input.selections.driver.chosenPartId),
  });
  for (const pid of motorId) partsById.delete(pid);
  return {
    design,
    match,
    bom,
    partsById,
    readiness: { issues, acceptedResetStart: acceptedResetStart(input, match), includesPending },
    draft: draftNotice(design.status, issues),
  };
}

export function bomFileName(design: Design, ext: string): string {
  const slug =
    design.name
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '')
      .slice(0, 60) || 'design';
  return `${slug}-rev${design.revision}.${ext}`;
}

export { bomToCsv };
