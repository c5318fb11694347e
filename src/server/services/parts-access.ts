/**
 * What each role may do with catalogue records, as the services decide it. Which routes a role may
 * call at all is the policy module's job (src/server/auth/policy.ts); these rules decide the outcome
 * inside an allowed call (a designer's new part enters as pending, a proposer may revise their own).
 */
import type { SessionUser } from '../auth/types.ts';
import type { PartScope } from '../repos/part-search.ts';

const has = (user: SessionUser | null, ...roles: string[]): boolean => !!user && user.roles.some((r) => roles.includes(r));

/** Librarians and admins curate parts, datasheets, imports, review and lifecycle. */
export const canCurate = (user: SessionUser | null): boolean => has(user, 'librarian', 'admin');
/** Designers propose parts (pending review); curators create them outright. */
export const canPropose = (user: SessionUser | null): boolean => has(user, 'designer', 'librarian', 'admin');
/**
 * Which parts a person may list: curators every part; everyone else approved parts and their own
 * proposals, whatever review-status filter they ask for ({} = no restriction).
 */
export const listingScope = (user: SessionUser | null): PartScope => (canCurate(user) ? {} : { approvedOrOwnedBy: user?.id ?? 0 });

/**
 * Whether a person may read one part (its API record and its page): the same rule as the listing —
 * curators every part, everyone else approved parts and their own proposals. Others get a 404, so a hidden
 * part is indistinguishable from a missing one.
 */
export const canSeePart = (user: SessionUser | null, part: { reviewStatus: string; createdBy: number | null }): boolean =>
  canCurate(user) || part.reviewStatus === 'approved' || (!!user && part.createdBy === user.id);

/** Buyers and curators keep supply data (sources and price breaks). */
export const canManageSupply = (user: SessionUser | null): boolean => has(user, 'buyer', 'librarian', 'admin');

/** How the person approving a part stands to its record under the four-eyes rule. */
export type FourEyesOutcome = { allowed: true; override: boolean } | { allowed: false; message: string };

/**
 * Four eyes: nobody approves a part they created or last edited; another librarian checks it. An admin may
 * approve anyway, and the approval is recorded as an admin override.
 */
export function fourEyesApproval(user: SessionUser, authors: { createdBy: number | null; lastEditedBy: number | null }): FourEyesOutcome {
  const created = authors.createdBy === user.id;
  const edited = authors.lastEditedBy === user.id;
  if (!created && !edited) return { allowed: true, override: false };
  if (has(user, 'admin')) return { allowed: true, override: true };
  const what = created && edited ? 'created and last edited' : created ? 'created' : 'last edited';
  return {
    allowed: false,
    message: `Four-eyes rule: you ${what} this part, so another librarian must approve it.`,
  };
}

/** The audit note of an admin's approval of their own work. */
export function fourEyesOverrideNote(authors: { createdBy: number | null; lastEditedBy: number | null }, userId: number): string {
  const what =
    authors.createdBy === userId && authors.lastEditedBy === userId
      ? 'created and last edited'
      : authors.createdBy === userId
        ? 'created'
        : 'last edited';
  return `Admin override of the four-eyes rule: the approver ${what} this part.`;
}
