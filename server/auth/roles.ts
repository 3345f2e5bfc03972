export const ROLES = ['volunteer', 'moderator', 'scientist', 'admin'] as const;
export type Role = (typeof ROLES)[number];

// Each role has the abilities of the ones before it.
const RANK: Record<Role, number> = { volunteer: 0, moderator: 1, scientist: 2, admin: 3 };

export const hasRole = (role: Role, atLeast: Role): boolean => RANK[role] >= RANK[atLeast];
