import { describe, expect, it } from 'vitest';
import type { Role } from '../../../../server/auth/roles';
import type { PersonRow } from '../../../../server/db/people';
import type { AppError } from '../../../../server/errors';
import { type Access, checkAccess } from '../../../../server/http/define-route';

const person = (role: Role, suspended = false): PersonRow => ({
  id: 1,
  email: 'a@example.com',
  displayName: 'A',
  role,
  suspendedAt: suspended ? '2026-12-01T00:00:00.000Z' : null,
  suspendedReason: null,
  newsletterOptIn: false,
  creditByName: false,
  emailConfirmedAt: null,
  sessionsValidAfter: null,
  lastActiveAt: null,
  deletedAt: null,
  createdAt: '2026-12-01T00:00:00.000Z',
  updatedAt: '2026-12-01T00:00:00.000Z',
});

function outcome(access: Access, who: PersonRow | undefined): string {
  try {
    checkAccess(access, who);
    return 'allowed';
  } catch (error) {
    return (error as AppError).code;
  }
}

describe('checkAccess', () => {
  it('lets each role do what the roles before it can, and no more', () => {
    const roles: Role[] = ['volunteer', 'moderator', 'scientist', 'admin'];
    for (const [i, needed] of roles.entries()) {
      for (const [j, has] of roles.entries()) {
        expect(outcome(needed, person(has)), `${has} on a ${needed} route`).toBe(
          j >= i ? 'allowed' : 'forbidden',
        );
      }
    }
  });

  it('asks a visitor to sign in on every route that is not public', () => {
    expect(outcome('public', undefined)).toBe('allowed');
    for (const access of ['signed-in', 'volunteer', 'admin'] as const)
      expect(outcome(access, undefined)).toBe('not_signed_in');
  });

  it('keeps a suspended account to its own signed-in routes', () => {
    expect(outcome('signed-in', person('admin', true))).toBe('allowed');
    expect(outcome('volunteer', person('admin', true))).toBe('account_suspended');
  });
});
