import { z } from 'zod';

// Ordered from least to most able: each role has the abilities of the ones before it.
export const roles = ['volunteer', 'moderator', 'scientist', 'admin'] as const;
export type Role = (typeof roles)[number];

export const roleLabels: Record<Role, string> = {
  volunteer: 'Volunteer',
  moderator: 'Moderator',
  scientist: 'Scientist',
  admin: 'Admin',
};

export const personSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  displayName: z.string(),
  role: z.enum(roles),
  suspended: z.boolean(),
  newsletterOptIn: z.boolean(),
  creditByName: z.boolean(),
  emailConfirmed: z.boolean(),
  createdAt: z.string(),
});

export type Person = z.infer<typeof personSchema>;

export const personResponseSchema = z.object({ person: personSchema });

export function hasRole(person: Pick<Person, 'role'>, atLeast: Role): boolean {
  return roles.indexOf(person.role) >= roles.indexOf(atLeast);
}
