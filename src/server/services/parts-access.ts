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

/** Buyers and curators keep supply data (sources and price breaks). */
export const canManageSupply = (user: SessionUser | null): boolean => has(user, 'buyer', 'librarian', 'admin');
