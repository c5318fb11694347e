/** The roles a person can hold; shared by the server (policy, sessions) and the islands (people pages). */
export const ROLES = ['admin', 'librarian', 'designer', 'buyer'] as const;
export type Role = (typeof ROLES)[number];
