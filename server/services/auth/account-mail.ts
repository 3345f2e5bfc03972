import { enqueue, type Queues } from '../../../worker/queues';
import { hashPassword, verifyPassword } from '../../auth/password';
import { appendAudit } from '../../db/audit-log';
import { consumeEmailToken, unusedTokenHolder } from '../../db/email-tokens';
import type { Db } from '../../db/knex';
import {
  anonymisePerson,
  findPersonById,
  markEmailConfirmed,
  type PersonRow,
  setPasswordEndingSessions,
} from '../../db/people';
import { AppError } from '../../errors';
import { checkNewPassword } from './password-rules';

// What a person does with the links in their mail, and deleting their own account.

/** The same answer whether or not an account has the address, so the form reveals nothing. */
export const RESET_REQUESTED =
  'If an account has this address, a link to choose a new password is on its way. It works once, for one hour.';

const noQueues = () =>
  new AppError('queues_unavailable', 'Mail cannot be sent just now: try again in a minute', 'unavailable');

const invalidToken = () =>
  new AppError('token_invalid', 'This link has expired or was already used', 'invalid', {
    token: 'This link has expired or was already used: ask for a new one',
  });

/**
 * Asks for a reset link. The request only queues the address: whether an account has it is looked up
 * by the mail job, so the answer and its timing are the same either way.
 */
export async function requestPasswordReset(queues: Queues | undefined, email: string) {
  if (!queues) throw noQueues();
  await enqueue(queues, 'mail', 'password-reset', { email });
  return { message: RESET_REQUESTED };
}

/** A new password through a reset link: single use, and every session of the person ends. */
export async function resetPassword(db: Db, token: string, password: string) {
  // The password is checked first, so a refused password does not use the link up.
  const holderId = await unusedTokenHolder(db, token, 'password-reset');
  const holder = holderId === null ? undefined : await findPersonById(db, holderId);
  if (holder) checkNewPassword(password, holder.email ?? '');
  const hash = await hashPassword(password);
  const personId = await consumeEmailToken(db, token, 'password-reset');
  if (personId === null) throw invalidToken();
  await setPasswordEndingSessions(db, personId, hash);
  await appendAudit(db, {
    actorId: personId,
    action: 'person.password_reset',
    entityType: 'person',
    entityId: personId,
  });
  return { ok: true };
}

export async function confirmAddress(db: Db, token: string): Promise<PersonRow> {
  const personId = await consumeEmailToken(db, token, 'confirm-address');
  if (personId === null) throw invalidToken();
  const person = await markEmailConfirmed(db, personId);
  if (!person) throw invalidToken();
  return person;
}

export async function resendAddressConfirmation(queues: Queues | undefined, person: PersonRow) {
  if (person.emailConfirmedAt) {
    throw new AppError('already_confirmed', 'Your address is already confirmed', 'conflict');
  }
  if (!queues) throw noQueues();
  await enqueue(queues, 'mail', 'confirm-address', { personId: person.id });
  return { message: `A new link is on its way to ${person.email}. It works for 24 hours.` };
}

/** Deletes one's own account after checking the password; verdicts stay, anonymously. */
export async function deleteOwnAccount(db: Db, person: PersonRow, password: string) {
  const stored = (await db('people').where({ id: person.id }).first('password_hash'))?.password_hash as
    | string
    | null
    | undefined;
  if (!stored || !(await verifyPassword(password, stored))) {
    throw new AppError('wrong_password', 'That password is not right', 'invalid', {
      password: 'That password is not right',
    });
  }
  await anonymisePerson(db, person.id);
  await appendAudit(db, {
    actorId: person.id,
    action: 'person.deleted_own_account',
    entityType: 'person',
    entityId: person.id,
  });
  return { deleted: true };
}
