/** What the middleware puts into Astro.locals, and the people types pages hand to islands. */
export const ROLES = ['admin', 'librarian', 'designer', 'buyer'] as const;
export type Role = (typeof ROLES)[number];

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
