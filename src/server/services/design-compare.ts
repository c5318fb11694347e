/**
 * Compare up to four parts for one line of a saved design: the design's own match is run (the same
 * pipeline as the workspace's list), each part's verdict and checks are taken from its ranked entry,
 * and a part the ranking left out is judged at the match's own drive (src/lib/compare.ts).
 */
import { db } from '../db.ts';
import type { SessionUser } from '../auth/types.ts';
import type { CompareQuery } from '../../lib/schemas/design.ts';
import {
  ROLE_CATEGORY,
  comparePart,
  compareRows,
  judgeOutside,
  nearMisses,
  outsideReason,
  roleList,
  type CompareRole,
  type ComparePart,
  type NearMiss,
} from '../../lib/compare.ts';
import { judgedAtShort } from '../../lib/design-words.ts';
import { partAuthorsByIds, partsByIds } from '../repos/parts.ts';
import { canSeePart } from './parts-access.ts';
import { getDesign, matchWithCatalogue } from './designs.ts';
import { ServiceError, notFound } from './errors.ts';
import { withMatchSlot } from './match-gate.ts';

export interface DesignComparison {
  designId: number;
  revision: number;
  designName: string;
  role: CompareRole;
  /** What the parts are judged at, in words (the switch list's drive). */
  judgedAt: string;
  /** Every check any compared part carries, in order (the table's rows). */
  rows: { id: string; label: string }[];
  parts: ComparePart[];
  /** The closest candidates of the role's whole list when nothing in it passes (else empty). */
  nearMisses: NearMiss[];
}

export async function compareDesignParts(user: SessionUser, designId: number, query: CompareQuery): Promise<DesignComparison> {
  const design = await getDesign(designId);
  const [authors, parts] = await Promise.all([partAuthorsByIds(db(), query.ids), partsByIds(db(), query.ids)]);
  for (const id of query.ids) {
    const who = authors.get(id);
    if (!who || !parts.has(id) || !canSeePart(user, who)) throw notFound(`Part ${id}`);
  }
  const category = ROLE_CATEGORY[query.role];
  const wrong = query.ids.filter((id) => parts.get(id)?.category !== category);
  if (wrong.length) {
    throw new ServiceError(
      400,
      `Only ${category === 'mosfet' ? 'MOSFETs' : `${category}s`} can be compared for the ${query.role} line.`,
      wrong.map((id) => ({ path: 'ids', message: `part ${id} is a ${parts.get(id)?.category}, not a ${category}` })),
    );
  }
  const input = design.input;
  return withMatchSlot(async () => {
    const { match, catalogue, prepared } = await matchWithCatalogue(input, query.includePending);
    const list = roleList(match, query.role);
    const picks = { switchId: input.selections.switch.chosenPartId, resetStartIntended: input.resetStartIntent != null };
    const columns = query.ids.map((id): ComparePart => {
      const part = parts.get(id)!;
      const rank = list.findIndex((e) => e.partId === id);
      if (rank >= 0) return comparePart(part, list[rank], rank + 1, null, input.boardQuantity);
      const judged = judgeOutside(query.role, part, prepared, catalogue, match, picks);
      if (!judged) {
        throw new ServiceError(409, 'The design has no switch to pair a driver with yet: choose or rank a switch first.', [
          { path: 'ids', message: `driver ${id} cannot be paired` },
        ]);
      }
      return comparePart(part, judged, null, outsideReason(part, query.includePending), input.boardQuantity);
    });
    return {
      designId,
      revision: design.revision,
      designName: design.name,
      role: query.role,
      judgedAt: judgedAtShort(match.switchDrive),
      rows: compareRows(columns),
      parts: columns,
      nearMisses: nearMisses(list),
    };
  });
}
