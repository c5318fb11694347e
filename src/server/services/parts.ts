/** Creating, editing and deleting catalogue parts: role rules, optimistic locking, audit trail, one transaction each. */
import { db } from '../db.ts';
import type { SessionUser } from '../auth/types.ts';
import type { Part, ReviewStatus } from '../../lib/domain/parts.ts';
import { diffStates, type PartInput, type PartUpdate } from '../../lib/schemas/parts.ts';
import { insertPart, type NewPart } from '../repos/parts.ts';
import {
  deletePartRow,
  findPartIdByMakerMpn,
  findPartRow,
  loadPart,
  replaceParams,
  replaceSources,
  updatePartHead,
} from '../repos/part-writes.ts';
import { insertAuditEvent } from '../repos/audit.ts';
import { withLockedVersion } from '../repos/versioned.ts';
import { PART_ENTITY } from './part-entity.ts';
import { listDatasheets } from '../repos/datasheets.ts';
import { designsUsingPart } from '../repos/designs.ts';
import { datasheetStore } from '../storage/index.ts';
import { canCurate, canPropose, canSeePart } from './parts-access.ts';
import { afterPartChange } from './design-alerts.ts';
import { notFound, ServiceError } from './errors.ts';

/** Curators get what they ask for (approved by default); everyone else proposes (pending). */
export function initialReviewStatus(user: SessionUser, requested: PartInput['reviewStatus']): ReviewStatus {
  if (!canCurate(user)) return 'pending';
  return requested ?? 'approved';
}

export function toNewPart(input: PartInput, reviewStatus: ReviewStatus): NewPart {
  return { ...input, reviewStatus, sources: input.sources ?? [] } as NewPart;
}

function duplicate(manufacturer: string, mpn: string, id: number): ServiceError {
  return new ServiceError(409, `${manufacturer} ${mpn} is already in the catalogue.`, [
    { path: 'mpn', message: `already in the catalogue as part ${id}` },
  ]);
}

export async function createPart(user: SessionUser, input: PartInput): Promise<Part> {
  const part = toNewPart(input, initialReviewStatus(user, input.reviewStatus));
  return db().transaction(async (trx) => {
    const existing = await findPartIdByMakerMpn(trx, part.manufacturer, part.mpn);
    if (existing !== null) throw duplicate(part.manufacturer, part.mpn, existing);
    const id = await insertPart(trx, part, user.id);
    const created = (await loadPart(trx, id))!;
    await insertAuditEvent(trx, {
      actorUserId: user.id,
      action: canCurate(user) ? 'part.create' : 'part.propose',
      entityType: 'part',
      entityId: id,
      before: null,
      after: created,
    });
    return created;
  });
}

/**
 * The whole record is replaced by what the form sends, at the version it was loaded at.
 * Curators may edit any part; a proposer may revise their own part until it is approved (it returns to pending).
 * Lifecycle moves go through changeLifecycle (with date and note), so an edit must keep the lifecycle.
 */
export async function updatePart(user: SessionUser, id: number, input: PartUpdate): Promise<Part> {
  const { before, after, unchanged } = await withLockedVersion(PART_ENTITY, {
    id,
    expectedVersion: input.version,
    actorUserId: user.id,
    action: 'part.update',
    // A save that changes nothing (sources re-inserted with new ids do not count) writes nothing.
    unchanged: (b, a) => !!b && !!a && diffStates(b, a).length === 0,
    precheck(row) {
      const ownProposal = row.created_by === user.id && row.review_status !== 'approved' && canPropose(user);
      if (!canCurate(user) && !ownProposal) throw new ServiceError(403, 'Your role may not edit this part.');
    },
    async apply(trx, row) {
      if (row.category !== input.category)
        throw new ServiceError(400, 'A part cannot change category.', [{ path: 'category', message: `the part is a ${row.category}` }]);
      if (row.lifecycle !== input.lifecycle) {
        throw new ServiceError(400, 'Change the lifecycle with its own action, which records the effective date and a note.', [
          { path: 'lifecycle', message: `the part is ${row.lifecycle}` },
        ]);
      }
      const other = await findPartIdByMakerMpn(trx, input.manufacturer, input.mpn);
      if (other !== null && other !== id) throw duplicate(input.manufacturer, input.mpn, other);
      const reviewStatus: ReviewStatus = canCurate(user) ? (input.reviewStatus ?? row.review_status) : 'pending';
      const next = toNewPart(input, reviewStatus);
      await updatePartHead(trx, id, { ...next, reviewStatus });
      await replaceParams(trx, id, next);
      if (input.sources !== undefined) await replaceSources(trx, id, next.sources);
    },
  });
  if (unchanged) return before!;
  // Right after the change commits: ready designs using the part must still hold, or go back to draft.
  const review = before!.reviewStatus !== after!.reviewStatus ? `, review ${before!.reviewStatus} → ${after!.reviewStatus}` : '';
  await afterPartChange(user, after!, `${after!.mpn} (part ${id}) was edited${review}`);
  return after!;
}

/** Deletes a part with its parameters, sources and datasheet records; the files go once the rows are gone. */
export async function deletePart(user: SessionUser, id: number, version: number | null): Promise<void> {
  const { result: keys } = await withLockedVersion(PART_ENTITY, {
    id,
    expectedVersion: version,
    actorUserId: user.id,
    action: 'part.delete',
    deleted: true,
    async apply(trx) {
      // Refused while any design uses it: the design_parts rows would cascade away while the saved revisions
      // still name the part, so a ready design would silently lose a BOM line. Obsolete retires a part and
      // re-verifies its designs instead.
      const uses = await designsUsingPart(trx, id);
      if (uses.length > 0) {
        const designs = [...new Map(uses.map((u) => [u.id, u])).values()];
        throw new ServiceError(
          409,
          `The part is used by ${designs.length} design(s); take it out of those designs or mark it obsolete instead.`,
          designs.slice(0, 20).map((d) => ({ path: 'id', message: `used by design ${d.id} “${d.name}” (${d.status})` })),
        );
      }
      const sheets = await listDatasheets(trx, id);
      await deletePartRow(trx, id);
      return sheets.map((s) => s.storageKey);
    },
  });
  for (const key of keys) await datasheetStore().delete(key);
}

/** One part as the viewer may read it: hidden parts (see canSeePart) answer 404 like missing ones. */
export async function getPart(user: SessionUser | null, id: number): Promise<Part> {
  const k = db();
  const row = await findPartRow(k, id);
  if (!row || !canSeePart(user, { reviewStatus: row.review_status, createdBy: row.created_by })) throw notFound('The part');
  const part = await loadPart(k, id);
  if (!part) throw notFound('The part');
  return part;
}
