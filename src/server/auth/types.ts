/** What the middleware puts into Astro.locals. */
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
