/** Review decisions, lifecycle moves and supply-data updates: each one locked, versioned and audited. */
import { db } from '../db.ts';
import type { SessionUser } from '../auth/types.ts';
import type { Part } from '../../lib/domain/parts.ts';
import type { LifecycleChange, ReviewDecision, SourcesUpdate } from '../../lib/schemas/parts.ts';
import { loadPart, lockPartRow, replaceSources, setLifecycle, setReview, touchPart } from '../repos/part-writes.ts';
import { findPerson, insertAuditEvent } from '../repos/audit.ts';
import { notFound, ServiceError, staleVersion } from './errors.ts';
import { sendRejectionNotice } from './parts-review-mail.ts';
import { reverifyDesignsUsingParts } from './design-status.ts';

/** Approve a pending (or draft) part, or reject a pending one with a reason the proposer is sent. */
export async function reviewPart(user: SessionUser, id: number, decision: ReviewDecision, baseUrl: string): Promise<Part> {
  const { part, proposerId, from } = await db().transaction(async (trx) => {
    const row = await lockPartRow(trx, id);
    if (!row) throw notFound('The part');
    if (row.version !== decision.version) throw staleVersion(row.version);
    const allowedFrom = decision.decision === 'approve' ? ['pending', 'draft'] : ['pending'];
    if (!allowedFrom.includes(row.review_status)) {
      throw new ServiceError(409, `The part is ${row.review_status}; only ${allowedFrom.join(' or ')} parts can be ${decision.decision === 'approve' ? 'approved' : 'rejected'}.`, [
        { path: 'decision', message: `review status is ${row.review_status}` },
      ]);
    }
    const before = await loadPart(trx, id);
    const status = decision.decision === 'approve' ? 'approved' : 'rejected';
    await setReview(trx, id, status, decision.reason || null);
    const after = (await loadPart(trx, id))!;
    await insertAuditEvent(trx, { actorUserId: user.id, action: `part.${decision.decision}`, entityType: 'part', entityId: id, before, after, note: decision.reason || null });
    return { part: after, proposerId: row.created_by, from: row.review_status };
  });
  await reverifyDesignsUsingParts([id], user, `${part.mpn} (part ${id}) review ${from} → ${part.reviewStatus}`);
  if (decision.decision === 'reject') {
    const proposer = await findPerson(db(), proposerId);
    if (proposer) await sendRejectionNotice({ to: proposer, part, reason: decision.reason, reviewer: user, link: `${baseUrl}/parts/${id}` });
  }
  return part;
}

/** Moves a part between active, NRND, last-buy and obsolete with the date it takes effect and a note. */
export async function changeLifecycle(user: SessionUser, id: number, change: LifecycleChange): Promise<Part> {
  const { part, from } = await db().transaction(async (trx) => {
    const row = await lockPartRow(trx, id);
    if (!row) throw notFound('The part');
    if (row.version !== change.version) throw staleVersion(row.version);
    const before = await loadPart(trx, id);
    await setLifecycle(trx, id, change.lifecycle, change.effectiveDate, change.note);
    const after = (await loadPart(trx, id))!;
    await insertAuditEvent(trx, { actorUserId: user.id, action: 'part.lifecycle', entityType: 'part', entityId: id, before, after, note: change.note });
    return { part: after, from: row.lifecycle };
  });
  await reverifyDesignsUsingParts([id], user, `${part.mpn} (part ${id}) lifecycle ${from} → ${part.lifecycle}`);
  return part;
}

/**
 * Replaces the sources and price breaks of a part (buyers and curators). Supply data is part of the record
 * the match reads (price at the build quantity), so ready designs using the part are re-verified right after
 * the change commits, as after every other part change.
 */
export async function updateSources(user: SessionUser, id: number, update: SourcesUpdate): Promise<Part> {
  const part = await db().transaction(async (trx) => {
    const row = await lockPartRow(trx, id);
    if (!row) throw notFound('The part');
    if (row.version !== update.version) throw staleVersion(row.version);
    const before = await loadPart(trx, id);
    await replaceSources(trx, id, update.sources);
    await touchPart(trx, id);
    const after = (await loadPart(trx, id))!;
    await insertAuditEvent(trx, { actorUserId: user.id, action: 'part.sources', entityType: 'part', entityId: id, before, after });
    return after;
  });
  await reverifyDesignsUsingParts([id], user, `${part.mpn} (part ${id}) supply data was changed`);
  return part;
}
