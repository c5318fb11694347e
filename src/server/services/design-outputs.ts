/** What the report and the bill of materials are made from: one design revision, matched and resolved. */
import type { Design } from '../../lib/domain/design.ts';
import type { Part } from '../../lib/domain/parts.ts';
import type { DesignMatch } from '../../lib/design-match.ts';
import { buildBom, bomToCsv, type BomLine } from '../../lib/bom.ts';
import { getDesign, matchInput, partsByIds, resolveMotor } from './designs.ts';

export interface DesignOutputs {
  design: Design;
  match: DesignMatch;
  bom: BomLine[];
  partsById: Map<number, Part>;
}

export async function designOutputs(id: number, revision?: number): Promise<DesignOutputs> {
  const design = await getDesign(id, revision);
  const input = design.input;
  const ids = (['switch', 'driver', 'diode'] as const).flatMap((r) => [
    ...(input.selections[r].chosenPartId != null ? [input.selections[r].chosenPartId as number] : []),
    ...input.selections[r].alternatePartIds,
  ]);
  const motor = await resolveMotor(input);
  const [match, partsById] = await Promise.all([matchInput(input, true, motor), partsByIds(ids)]);
  const motorLine = motor.part
    ? { manufacturer: motor.part.manufacturer, mpn: motor.part.mpn, description: motor.part.description }
    : { manufacturer: '(entered by hand)', mpn: motor.label, description: 'Motor from datasheet points entered in the design' };
  const bom = buildBom({ input, motor: motorLine, partsById, pull: match.powerOn?.recommendedPull ?? null });
  return { design, match, bom, partsById };
}

export function bomFileName(design: Design, ext: string): string {
  const slug = design.name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'design';
  return `${slug}-rev${design.revision}.${ext}`;
}

export { bomToCsv };
