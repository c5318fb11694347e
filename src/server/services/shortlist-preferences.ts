/**
 * A buyer's preferred source and note for one option of a shortlist line (design, BOM line, part). Last
 * write wins, under a lock on the design row (so a design save cannot change its lines in between); each
 * write leaves an audit event with the state before and after. The part must be on that line of the
 * design's current revision and the source must be one of that part's: otherwise a 409 naming the field,
 * and nothing is written.
 */
import { db } from '../db.ts';
import type { SessionUser } from '../auth/types.ts';
import type { ShortlistPreferenceInput } from '../../lib/schemas/shortlist.ts';
import { insertAuditEvent } from '../repos/audit.ts';
import {
  deletePreference,
  designUsesPart,
  listPreferences,
  lockDesignRow,
  lockPreference,
  sourceOfPart,
  upsertPreference,
  type StoredPreference,
} from '../repos/shortlist-preferences.ts';
import { notFound, ServiceError } from './errors.ts';

const auditState = (p: StoredPreference | null) => p && { line: p.line, partId: p.partId, source: p.source, note: p.note };

/** Sets (or clears, when both source and note are empty) the preference; returns it (null when cleared). */
export async function setShortlistPreference(
  actor: SessionUser,
  designId: number,
  input: ShortlistPreferenceInput,
): Promise<{ preference: StoredPreference | null }> {
  await db().transaction(async (trx) => {
    if (!(await lockDesignRow(trx, designId))) throw notFound('The design');
    if (!(await designUsesPart(trx, designId, input.line, input.partId)))
      throw new ServiceError(409, `Part ${input.partId} is not an option of the ${input.line} line of this design.`, [
        { path: 'partId', message: `not the chosen part or an alternate of the ${input.line} line` },
      ]);
    const source = input.sourceId === null ? null : await sourceOfPart(trx, input.partId, input.sourceId);
    if (input.sourceId !== null && !source)
      throw new ServiceError(409, `Source ${input.sourceId} does not sell part ${input.partId}.`, [
        { path: 'sourceId', message: 'not one of the sources of this part' },
      ]);
    const before = await lockPreference(trx, designId, input.line, input.partId);
    let entityId = before?.id ?? null;
    if (source === null && input.note === null) {
      if (before) await deletePreference(trx, before.id);
    } else
      entityId = await upsertPreference(trx, {
        designId,
        line: input.line,
        partId: input.partId,
        source,
        note: input.note,
        setBy: actor.id,
      });
    if (entityId !== null)
      await insertAuditEvent(trx, {
        actorUserId: actor.id,
        action: 'shortlist_preference.set',
        entityType: 'shortlist_preference',
        entityId,
        before: auditState(before),
        after:
          source === null && input.note === null ? null : { designId, line: input.line, partId: input.partId, source, note: input.note },
      });
  });
  const stored = (await listPreferences(db(), [designId])).find((p) => p.line === input.line && p.partId === input.partId) ?? null;
  return { preference: stored };
}

/** The preferences on a design's current lines, for its page (read-only there). */
export async function designPreferences(designId: number): Promise<StoredPreference[]> {
  return listPreferences(db(), [designId]);
}
