import { appendAudit } from '../../db/audit-log';
import type { Db } from '../../db/knex';
import { findPersonById, updatePerson } from '../../db/people';
import { AppError } from '../../errors';
import { verifyUnsubscribeToken } from '../../mail/unsubscribe-token';

const badLink = () =>
  new AppError('token_invalid', 'This unsubscribe link is not whole or not ours', 'invalid', {
    token: 'The link is not whole: copy all of it from the e-mail',
  });

/** Whose newsletter link this is, and whether they still get the newsletter (for the page's wording). */
export async function unsubscribeTarget(db: Db, secret: string, token: string) {
  const personId = verifyUnsubscribeToken(secret, token);
  const person = personId === null ? undefined : await findPersonById(db, personId);
  if (!person) throw badLink();
  return { subscribed: person.newsletterOptIn && !person.deletedAt };
}

/** One click: the newsletter stops for this person at once (checked again by every send). */
export async function unsubscribe(db: Db, secret: string, token: string) {
  const personId = verifyUnsubscribeToken(secret, token);
  const person = personId === null ? undefined : await findPersonById(db, personId);
  if (!person) throw badLink();
  if (person.newsletterOptIn) {
    await updatePerson(db, person.id, { newsletterOptIn: false });
    await appendAudit(db, {
      actorId: person.id,
      action: 'person.unsubscribed',
      entityType: 'person',
      entityId: person.id,
    });
  }
  return { unsubscribed: true };
}
