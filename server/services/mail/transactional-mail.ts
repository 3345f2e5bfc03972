import { issueEmailToken } from '../../db/email-tokens';
import type { Db } from '../../db/knex';
import { findPersonByEmail, findPersonById } from '../../db/people';
import type { Mailer } from '../../mail/mailer';
import {
  CONFIRM_LINK_VALID_HOURS,
  RESET_LINK_VALID_HOURS,
  renderTransactionalMessage,
} from '../../mail/transactional';

// Transactional mail, sent by the mail queue's processor: a token where the mail carries a link, the
// message rendered by server/mail/transactional.ts, and the mailer. Each answers what it did, for the
// job's result; nobody is mailed at a deleted or unknown address.

export interface MailContext {
  db: Db;
  mailer: Mailer;
  publicUrl: string;
}

const HOUR_MS = 3_600_000;

export async function mailAddressConfirmation(ctx: MailContext, personId: number) {
  const person = await findPersonById(ctx.db, personId);
  if (!person?.email || person.deletedAt) return { sent: false, reason: 'no such account' };
  if (person.emailConfirmedAt) return { sent: false, reason: 'already confirmed' };
  const token = await issueEmailToken(
    ctx.db,
    person.id,
    'confirm-address',
    CONFIRM_LINK_VALID_HOURS * HOUR_MS,
  );
  const message = renderTransactionalMessage('confirm-address', {
    displayName: person.displayName,
    confirmUrl: `${ctx.publicUrl}/confirm-email?token=${encodeURIComponent(token)}`,
  });
  const { messageId } = await ctx.mailer.send({ to: person.email, ...message });
  return { sent: true, messageId };
}

export async function mailPasswordReset(ctx: MailContext, email: string) {
  const found = await findPersonByEmail(ctx.db, email);
  // Suspended accounts get no link: they could not sign in with the new password anyway.
  if (!found?.person.email || found.person.suspendedAt) return { sent: false, reason: 'no usable account' };
  const token = await issueEmailToken(
    ctx.db,
    found.person.id,
    'password-reset',
    RESET_LINK_VALID_HOURS * HOUR_MS,
  );
  const message = renderTransactionalMessage('password-reset', {
    displayName: found.person.displayName,
    resetUrl: `${ctx.publicUrl}/password-reset/confirm?token=${encodeURIComponent(token)}`,
  });
  const { messageId } = await ctx.mailer.send({ to: found.person.email, ...message });
  return { sent: true, messageId };
}

export async function mailModeratorWarning(ctx: MailContext, personId: number, note: string) {
  const person = await findPersonById(ctx.db, personId);
  if (!person?.email || person.deletedAt) return { sent: false, reason: 'no such account' };
  const message = renderTransactionalMessage('moderator-warning', {
    displayName: person.displayName,
    moderatorNote: note,
    recordUrl: `${ctx.publicUrl}/record`,
  });
  const { messageId } = await ctx.mailer.send({ to: person.email, ...message });
  return { sent: true, messageId };
}
