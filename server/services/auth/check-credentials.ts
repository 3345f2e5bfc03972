import { decoyPasswordHash, hashPassword, needsRehash, verifyPassword } from '../../auth/password';
import type { Db } from '../../db/knex';
import { findPersonByEmail, type PersonRow, updatePasswordHash } from '../../db/people';
import { AppError } from '../../errors';

// One message for an unknown e-mail and a wrong password, so that neither gives away which it was.
export const INVALID_CREDENTIALS = 'E-mail or password is not right';

/** Answers the person whose e-mail and password these are, or throws `invalid_credentials`. */
export async function checkCredentials(db: Db, email: string, password: string): Promise<PersonRow> {
  const found = await findPersonByEmail(db, email);
  const storedHash = found?.passwordHash ?? (await decoyPasswordHash());
  const matches = await verifyPassword(password, storedHash);
  if (!found?.passwordHash || !matches) {
    throw new AppError('invalid_credentials', INVALID_CREDENTIALS, 'unauthenticated');
  }
  if (found.person.suspendedAt) {
    throw new AppError(
      'account_suspended',
      'This account is suspended; write to the team if you think this is wrong',
      'forbidden',
    );
  }
  if (needsRehash(found.passwordHash)) {
    await updatePasswordHash(db, found.person.id, await hashPassword(password));
  }
  return found.person;
}
