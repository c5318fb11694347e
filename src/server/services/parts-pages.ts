/** What the catalogue pages need besides the part itself, as plain view values. */
import { db } from '../db.ts';
import type { SessionUser } from '../auth/types.ts';
import type { Part } from '../../lib/domain/parts.ts';
import { packagesByCategory } from '../repos/part-writes.ts';
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
export async function reviewQueue(): Promise<
  {
    id: number;
    category: string;
    manufacturer: string;
    mpn: string;
    description: string;
    status: string;
    proposer: string | null;
    createdAt: string;
    version: number;
  }[]
> {
  const rows = await db()('parts as p')
    .leftJoin('users as u', 'u.id', 'p.created_by')
    .select(
      'p.id',
      'p.category',
      'p.manufacturer',
      'p.mpn',
      'p.description',
      'p.review_status',
      'p.created_at',
      'p.version',
      'u.name as proposer',
    )
    .whereIn('p.review_status', ['pending'])
    .orderBy([{ column: 'p.created_at' }, { column: 'p.id' }]);
  return rows.map((r) => ({
    id: r.id,
    category: r.category,
    manufacturer: r.manufacturer,
    mpn: r.mpn,
    description: r.description,
    status: r.review_status,
    proposer: r.proposer,
    createdAt: new Date(r.created_at).toISOString(),
    version: r.version,
  }));
}
