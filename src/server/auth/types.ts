/** What the middleware puts into Astro.locals, and the people types pages hand to islands. */
export { ROLES, type Role } from '../../lib/domain/roles.ts';
import type { Role } from '../../lib/domain/roles.ts';

export interface SessionUser {
  id: number;
  email: string;
  name: string;
  roles: Role[];
}

export interface SessionInfo {
  id: string;
  expiresAt: Date;
}

/** A person as the people page shows them: `invited` until they set a password. */
export type PersonStatus = 'active' | 'invited' | 'deactivated';

export interface Person {
  id: number;
  email: string;
  name: string;
  roles: Role[];
  status: PersonStatus;
  createdAt: string;
}
