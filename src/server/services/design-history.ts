/** A design's revision history for its page: the diff of two saved revisions with the parts named. */
import { db } from '../db.ts';
import type { DesignInput } from '../../lib/domain/design.ts';
import { diffDesignInputs, type DesignChange } from '../../lib/design-diff.ts';
import { loadRevisionInput } from '../repos/designs.ts';
import { loadPartsByIds } from '../repos/part-writes.ts';
import { notFound } from './errors.ts';

function partIds(input: DesignInput): number[] {
  const ids = Object.values(input.selections).flatMap((s) => [...(s.chosenPartId === null ? [] : [s.chosenPartId]), ...s.alternatePartIds]);
  return input.motor.source === 'catalogue' ? [input.motor.partId, ...ids] : ids;
}

/** What changed from revision `from` to revision `to` of a design; 404 when either revision does not exist. */
export async function revisionDiff(designId: number, from: number, to: number): Promise<DesignChange[]> {
  const k = db();
  const [before, after] = await Promise.all([loadRevisionInput(k, designId, from), loadRevisionInput(k, designId, to)]);
  if (!before) throw notFound(`Revision ${from} of design ${designId}`);
  if (!after) throw notFound(`Revision ${to} of design ${designId}`);
  const parts = await loadPartsByIds(k, [...new Set([...partIds(before), ...partIds(after)])]);
  const names = new Map(parts.map((p) => [p.id!, p.mpn]));
  return diffDesignInputs(before, after, (id) => names.get(id));
}
