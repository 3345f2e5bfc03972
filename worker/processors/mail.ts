import type Bull from 'bull';
import {
  mailAddressConfirmation,
  mailModeratorWarning,
  mailPasswordReset,
} from '../../server/services/mail/transactional-mail';
import { JOB_DATA } from '../queues';
import type { ProcessorContext } from './context';

// Bull retries a job whose send failed (the SMTP server was down), with the queue's backoff.
export function mailProcessor(ctx: ProcessorContext & { mailer: NonNullable<ProcessorContext['mailer']> }) {
  const mail = { db: ctx.db, mailer: ctx.mailer, publicUrl: ctx.config.publicUrl };
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
      default:
        throw new Error(`mail has no job named ${job.name}`);
    }
  };
}
