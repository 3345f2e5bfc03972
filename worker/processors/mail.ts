import type Bull from 'bull';
import { resolveSessionSecret } from '../../server/auth/session-secret';
import { findNewsletter } from '../../server/db/newsletters';
import { findPersonById } from '../../server/db/people';
import {
  mailAddressConfirmation,
  mailModeratorWarning,
  mailPasswordReset,
} from '../../server/services/mail/transactional-mail';
import { deliverNewsletter, renderFor } from '../../server/services/newsletters/deliver';
import { JOB_DATA } from '../queues';
import type { ProcessorContext } from './context';

// Bull retries a job whose send failed (the SMTP server was down), with the queue's backoff.
export function mailProcessor(ctx: ProcessorContext & { mailer: NonNullable<ProcessorContext['mailer']> }) {
  const mail = { db: ctx.db, mailer: ctx.mailer, publicUrl: ctx.config.publicUrl };
  const delivery = {
    ...mail,
    secret: resolveSessionSecret(ctx.config.sessionSecret, ctx.config.dataDir),
    ratePerSecond: ctx.config.mailRatePerSecond,
  };
  return async (job: Bull.Job) => {
    switch (job.name) {
      case 'confirm-address':
        return mailAddressConfirmation(mail, JOB_DATA.mail['confirm-address'].parse(job.data).personId);
      case 'password-reset':
        return mailPasswordReset(mail, JOB_DATA.mail['password-reset'].parse(job.data).email);
      case 'moderator-warning': {
        const { personId, note } = JOB_DATA.mail['moderator-warning'].parse(job.data);
        return mailModeratorWarning(mail, personId, note);
      }
      case 'newsletter':
        return deliverNewsletter(delivery, JOB_DATA.mail.newsletter.parse(job.data).newsletterId);
      case 'newsletter-test': {
        const { newsletterId, personId } = JOB_DATA.mail['newsletter-test'].parse(job.data);
        const [newsletter, person] = [
          await findNewsletter(ctx.db, newsletterId),
          await findPersonById(ctx.db, personId),
        ];
        if (!newsletter || !person?.email) return { sent: false, reason: 'gone' };
        const message = await renderFor(delivery, newsletter, person);
        const { messageId } = await ctx.mailer.send({
          to: person.email,
          ...message,
          subject: `[Test] ${message.subject}`,
        });
        return { sent: true, messageId };
      }
      default:
        throw new Error(`mail has no job named ${job.name}`);
    }
  };
}
