import { describe, expect, it } from 'vitest';
import { areas } from '@/config/areas';
import { hasRole, type Role, roles } from '@/lib/person';

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
