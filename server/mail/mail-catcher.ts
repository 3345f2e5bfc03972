import type { AddressInfo } from 'node:net';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { Db } from '../db/knex';
import { insertMailMessage } from '../db/mail-messages';
import type { Logger } from '../logger';

// The embedded mail catcher: a real SMTP server on a loopback port that accepts every message and
// keeps it, parsed, in the database for the Admin outbox. Dipdeck's mail goes to it through the same
// nodemailer code that would talk to a real relay (SMTP_URL), so what the outbox shows is what a
// relay would have been given.

/** Larger messages are refused by the SMTP server itself (our own bound: newsletters are small). */
export const MAX_MESSAGE_BYTES = 5 * 1024 * 1024;

export interface MailCatcher {
  port: number;
  close: () => Promise<void>;
}

export async function startMailCatcher(db: Db, logger: Logger): Promise<MailCatcher> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    banner: 'Dipdeck mail catcher',
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('error', (error) => callback(error));
      stream.on('end', () => {
        if ((stream as unknown as { sizeExceeded?: boolean }).sizeExceeded) {
          callback(Object.assign(new Error('Message too large'), { responseCode: 552 }));
          return;
        }
        const raw = Buffer.concat(chunks);
        void store(
          raw,
          session.envelope.rcptTo.map((rcpt) => rcpt.address),
        )
          .then(() => callback())
          .catch((error: unknown) => {
            logger.error({ err: error }, 'the mail catcher could not store a message');
            callback(Object.assign(new Error('Could not store the message'), { responseCode: 451 }));
          });
      });
    },
  });

  async function store(raw: Buffer, recipients: string[]): Promise<void> {
    const parsed = await simpleParser(raw);
    await insertMailMessage(db, {
      messageId: parsed.messageId ?? null,
      from: parsed.from?.text ?? '',
      to: recipients,
      subject: parsed.subject ?? '',
      // The raw header lines, in order, unfolded into key and value.
      headers: parsed.headerLines.map(({ key, line }) => ({
        key,
        value: line
          .slice(line.indexOf(':') + 1)
          .replace(/\r?\n[ \t]+/g, ' ')
          .trim(),
      })),
      text: parsed.text ?? null,
      html: typeof parsed.html === 'string' ? parsed.html : null,
      sizeBytes: raw.length,
    });
  }

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => resolve());
  });
  server.on('error', (error) => logger.error({ err: error }, 'mail catcher error'));
  const { port } = server.server.address() as AddressInfo;
  return {
    port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
