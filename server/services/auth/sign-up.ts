import { isCommonPassword } from '../../auth/common-passwords';
import { hashPassword } from '../../auth/password';
import type { Db } from '../../db/knex';
import { insertPerson, normaliseEmail, type PersonRow } from '../../db/people';
import { AppError } from '../../errors';

export interface SignUpInput {
  email: string;
  displayName: string;
  password: string;
  newsletterOptIn: boolean;
}

export async function signUp(db: Db, input: SignUpInput): Promise<PersonRow> {
  if (isCommonPassword(input.password)) {
    throw new AppError('password_too_common', 'This password is too common', 'invalid', {
      password: 'This password is one of the most common ones and easy to guess: choose another',
    });
  }
  if (input.password.toLowerCase().includes(normaliseEmail(input.email).split('@')[0] ?? '\u0000')) {
    throw new AppError('password_contains_email', 'The password contains the e-mail address', 'invalid', {
      password: 'The password must not contain your e-mail address',
    });
  }
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
