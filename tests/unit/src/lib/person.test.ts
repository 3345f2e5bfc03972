import { describe, expect, it } from 'vitest';
import { areas } from '@/config/areas';
import { hasRole, personSchema, type Role, roles } from '@/lib/person';

function areasFor(role: Role): string[] {
  return areas.filter((area) => hasRole({ role }, area.minRole)).map((area) => area.label);
}

describe('areas by role', () => {
  it('gives each role the areas of the roles before it, and one more from moderator on', () => {
    expect(areasFor('volunteer')).toEqual(['Deck', 'My record']);
    expect(areasFor('moderator')).toEqual(['Deck', 'My record', 'Desk']);
    expect(areasFor('scientist')).toEqual(['Deck', 'My record', 'Desk', 'Lab']);
    expect(areasFor('admin')).toEqual(['Deck', 'My record', 'Desk', 'Lab', 'Admin']);
  });

  it('orders roles from least to most able', () => {
    expect(roles).toEqual(['volunteer', 'moderator', 'scientist', 'admin']);
  });
});

describe('personSchema', () => {
  const person = {
    id: 1,
    email: 'ada@example.com',
    displayName: 'Ada',
    role: 'volunteer',
    suspended: false,
    newsletterOptIn: false,
    creditByName: true,
    createdAt: '2026-12-01T00:00:00.000Z',
  };

  it('reads whether the address is confirmed, and refuses an answer without it', () => {
    expect(personSchema.parse({ ...person, emailConfirmed: false }).emailConfirmed).toBe(false);
    expect(personSchema.parse({ ...person, emailConfirmed: true }).emailConfirmed).toBe(true);
    expect(personSchema.safeParse(person).success).toBe(false);
  });
});
