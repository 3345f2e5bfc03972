import { hashPassword } from '../../server/auth/password';
import type { Role } from '../../server/auth/roles';
import type { Db } from '../../server/db/knex';
import { insertPerson, type PersonRow } from '../../server/db/people';

export interface PersonOverrides {
  email?: string;
  displayName?: string;
  password?: string;
  role?: Role;
  newsletterOptIn?: boolean;
  creditByName?: boolean;
  /** Reuse one hash per password within a process: scrypt at full strength costs ~0.6 s. Tests only. */
  reuseHash?: boolean;
}

let counter = 0;
const hashCache = new Map<string, Promise<string>>();

export async function createPerson(db: Db, overrides: PersonOverrides = {}): Promise<PersonRow> {
  counter += 1;
  const password = overrides.password ?? 'correct horse battery staple';
  const passwordHash = overrides.reuseHash
    ? await (hashCache.get(password) ?? hashCache.set(password, hashPassword(password)).get(password)!)
    : await hashPassword(password);
  const person = await insertPerson(db, {
    email: overrides.email ?? `person${counter}-${Date.now()}@example.com`,
    displayName: overrides.displayName ?? `Person ${counter}`,
    passwordHash,
    role: overrides.role ?? 'volunteer',
    newsletterOptIn: overrides.newsletterOptIn ?? false,
    creditByName: overrides.creditByName ?? false,
  });
  if (!person) throw new Error(`createPerson: e-mail ${overrides.email} is taken`);
  return person;
}
