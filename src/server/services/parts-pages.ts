/** What the catalogue pages need besides the part itself, as plain view values. */
import { db } from '../db.ts';
import type { SessionUser } from '../auth/types.ts';
import type { Part } from '../../lib/domain/parts.ts';
import { packagesByCategory } from '../repos/part-writes.ts';
import { listReviewQueue, type ReviewQueueItem } from '../repos/part-search.ts';
import { canCurate, canManageSupply, canPropose } from './parts-access.ts';

export async function searchPageData(
  user: SessionUser | null,
): Promise<{ packages: Record<string, string[]>; canCreate: boolean; canImport: boolean }> {
  return { packages: await packagesByCategory(db()), canCreate: canPropose(user), canImport: canCurate(user) };
}

export interface PartPermissions {
  edit: boolean;
  review: boolean;
  lifecycle: boolean;
  datasheets: boolean;
  supply: boolean;
  delete: boolean;
}

export function partPermissions(user: SessionUser | null, part: Part, proposerId: number | null): PartPermissions {
  const curator = canCurate(user);
  const ownProposal = !!user && proposerId === user.id && part.reviewStatus !== 'approved' && canPropose(user);
  return {
    edit: curator || ownProposal,
    review: curator && (part.reviewStatus === 'pending' || part.reviewStatus === 'draft'),
    lifecycle: curator,
    datasheets: curator,
    supply: canManageSupply(user),
    delete: curator,
  };
}

/** Parts waiting for review, oldest first, with who proposed them. */
export async function reviewQueue(): Promise<ReviewQueueItem[]> {
  return listReviewQueue(db());
}
