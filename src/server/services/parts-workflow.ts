/** Review decisions, lifecycle moves and supply-data updates: each one locked, versioned and audited. */
import { db } from '../db.ts';
import type { SessionUser } from '../auth/types.ts';
import type { Part, PartSource } from '../../lib/domain/parts.ts';
import type { LifecycleChange, ReviewDecision, SourcesUpdate } from '../../lib/schemas/parts.ts';
import { replaceSources, setLifecycle, setReview, touchPart } from '../repos/part-writes.ts';
import { findPerson, lastEditors, PART_CONTENT_ACTIONS } from '../repos/audit.ts';
import { fourEyesApproval, fourEyesOverrideNote } from './parts-access.ts';
import { withLockedVersion } from '../repos/versioned.ts';
import { PART_ENTITY } from './part-entity.ts';
import { ServiceError } from './errors.ts';
import { sendRejectionNotice } from './parts-review-mail.ts';
import { afterPartChange } from './design-alerts.ts';

/**
 * Approve a pending (or draft) part, or reject a pending one with a reason the proposer is sent. Four eyes:
 * a librarian may not approve a part they created or last edited (403); an admin may, recorded as an override.
 */
export async function reviewPart(user: SessionUser, id: number, decision: ReviewDecision, baseUrl: string): Promise<Part> {
  if (decision.decision === 'reject' && decision.reason.length < 3) {
    throw new ServiceError(400, 'Give a reason to reject: say what is wrong so the proposer can fix it.', [
      { path: 'reason', message: 'at least 3 characters: what is wrong, so the proposer can fix it' },
    ]);
  }
  const { row, after } = await withLockedVersion(PART_ENTITY, {
    id,
    expectedVersion: decision.version,
    actorUserId: user.id,
    action: `part.${decision.decision}`,
    note: (override) => [override, decision.reason || null].filter(Boolean).join(' ') || null,
    async apply(trx, locked): Promise<string | null> {
      const allowedFrom = decision.decision === 'approve' ? ['pending', 'draft'] : ['pending'];
      if (!allowedFrom.includes(locked.review_status)) {
        throw new ServiceError(
          409,
          `The part is ${locked.review_status}; only ${allowedFrom.join(' or ')} parts can be ${decision.decision === 'approve' ? 'approved' : 'rejected'}.`,
          [{ path: 'decision', message: `review status is ${locked.review_status}` }],
        );
      }
      let override: string | null = null;
      if (decision.decision === 'approve') {
        const authors = {
          createdBy: locked.created_by,
          lastEditedBy: (await lastEditors(trx, 'part', [id], PART_CONTENT_ACTIONS)).get(id) ?? null,
        };
        const fourEyes = fourEyesApproval(user, authors);
        if (!fourEyes.allowed) throw new ServiceError(403, fourEyes.message, [{ path: 'decision', message: 'four-eyes rule' }]);
        if (fourEyes.override) override = fourEyesOverrideNote(authors, user.id);
      }
      await setReview(trx, id, decision.decision === 'approve' ? 'approved' : 'rejected', decision.reason || null);
      return override;
    },
  });
  const part = after!;
  await afterPartChange(user, part, `${part.mpn} (part ${id}) review ${row.review_status} → ${part.reviewStatus}`);
  if (decision.decision === 'reject') {
    const proposer = await findPerson(db(), row.created_by);
    if (proposer)
      await sendRejectionNotice({ to: proposer, part, reason: decision.reason, reviewer: user, link: `${baseUrl}/parts/${id}` });
  }
  return part;
}

/** Moves a part between active, NRND, last-buy and obsolete with the date it takes effect and a note. */
export async function changeLifecycle(user: SessionUser, id: number, change: LifecycleChange): Promise<Part> {
  const { row, after } = await withLockedVersion(PART_ENTITY, {
    id,
    expectedVersion: change.version,
    actorUserId: user.id,
    action: 'part.lifecycle',
    note: change.note,
    apply: (trx) => setLifecycle(trx, id, change.lifecycle, change.effectiveDate, change.note),
  });
  const part = after!;
  await afterPartChange(user, part, `${part.mpn} (part ${id}) lifecycle ${row.lifecycle} → ${part.lifecycle}`, row.lifecycle);
  return part;
}

/** The supply data without row ids, for comparing two snapshots. */
const supplyKey = (sources: PartSource[]): string => JSON.stringify(sources.map(({ id: _id, ...rest }) => rest));
const sameSources = (a: PartSource[], b: PartSource[]): boolean => supplyKey(a) === supplyKey(b);

/**
 * Replaces the sources and price breaks of a part (buyers and curators). Supply data is part of the record
 * the match reads (price at the build quantity), so ready designs using the part are re-verified right after
 * the change commits, as after every other part change.
 */
export async function updateSources(user: SessionUser, id: number, update: SourcesUpdate): Promise<Part> {
  const { after, unchanged } = await withLockedVersion(PART_ENTITY, {
    id,
    expectedVersion: update.version,
    actorUserId: user.id,
    action: 'part.sources',
    async apply(trx) {
      await replaceSources(trx, id, update.sources);
      await touchPart(trx, id);
    },
    // Saving the sources as loaded (new row ids do not count) writes nothing: no version, no audit row.
    unchanged: (before, after) => !!before && !!after && sameSources(before.sources, after.sources),
  });
  const part = after!;
  if (unchanged) return part;
  await afterPartChange(user, part, `${part.mpn} (part ${id}) supply data was changed`);
  return part;
}
