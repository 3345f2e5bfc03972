import { hashPassword } from '../../auth/password';
import type { Db } from '../../db/knex';
import { insertPerson, type PersonRow } from '../../db/people';
import { AppError } from '../../errors';
import { checkNewPassword } from './password-rules';

export interface SignUpInput {
  email: string;
  displayName: string;
  password: string;
  newsletterOptIn: boolean;
}

export async function signUp(db: Db, input: SignUpInput): Promise<PersonRow> {
  checkNewPassword(input.password, input.email);
  const person = await insertPerson(db, {
    email: input.email,
    displayName: input.displayName,
    passwordHash: await hashPassword(input.password),
    newsletterOptIn: input.newsletterOptIn,
  });
  if (!person) {
    throw new AppError('email_taken', 'An account with this e-mail already exists', 'conflict', {
      email: 'An account with this e-mail already exists: sign in instead',
    });
  }
  return person;
}
