import type { Config } from '../../server/config';
import type { Db } from '../../server/db/knex';
import type { Logger } from '../../server/logger';
import type { Mailer } from '../../server/mail/mailer';
import type { Queues } from '../queues';

/** What every processor may use: the same services the API uses, on the same database. */
export interface ProcessorContext {
  config: Config;
  db: Db;
  logger: Logger;
  /** To queue follow-up work (the sweeper re-queues lost jobs). */
  queues: Queues;
  /** Sends mail; a process without one leaves the mail queue's jobs waiting for one that has. */
  mailer?: Mailer;
}
