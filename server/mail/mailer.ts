import nodemailer from 'nodemailer';
import type { Config } from '../config';
import type { Db } from '../db/knex';
import type { Logger } from '../logger';
import { type MailCatcher, startMailCatcher } from './mail-catcher';

// The one place that sends mail. With SMTP_URL, to that relay; without, to the embedded mail
// catcher this process starts on a loopback port. Either way through the same nodemailer transport.

export interface OutgoingMail {
  to: string;
  /** The e-mail's Subject header (RFC 5322): the open standard's word, not a Dipdeck term. */
  subject: string;
  html: string;
  text: string;
  /** Extra headers (List-Unsubscribe and List-Unsubscribe-Post for newsletters). */
  headers?: Record<string, string>;
}

export interface Mailer {
  /** Resolves once the SMTP server accepted the message; rejects when it refused or could not be reached. */
  send: (mail: OutgoingMail) => Promise<{ messageId: string }>;
  /** Where mail goes, for logs and the health check (no password). */
  describe: () => string;
  close: () => Promise<void>;
}

export async function createMailer(
  config: Pick<Config, 'smtpUrl' | 'mailFrom'>,
  db: Db,
  logger: Logger,
): Promise<Mailer> {
  let catcher: MailCatcher | null = null;
  let url = config.smtpUrl;
  if (!url) {
    catcher = await startMailCatcher(db, logger);
    url = `smtp://127.0.0.1:${catcher.port}`;
  }
  const transport = catcher
    ? nodemailer.createTransport({ host: '127.0.0.1', port: catcher.port, secure: false, ignoreTLS: true })
    : nodemailer.createTransport(url);
  const where = catcher ? `the embedded mail catcher (127.0.0.1:${catcher.port})` : redact(url);
  return {
    async send(mail) {
      const info = await transport.sendMail({
        from: config.mailFrom,
        to: mail.to,
        subject: mail.subject,
        html: mail.html,
        text: mail.text,
        headers: mail.headers,
      });
      if (info.rejected.length > 0) throw new Error(`the SMTP server refused ${info.rejected.join(', ')}`);
      return { messageId: info.messageId };
    },
    describe: () => where,
    async close() {
      transport.close();
      await catcher?.close();
    },
  };
}

function redact(url: string): string {
  try {
    const parsed = new URL(url);
    if (parsed.password) parsed.password = '***';
    return parsed.toString();
  } catch {
    return 'the configured SMTP server';
  }
}
