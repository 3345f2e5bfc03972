import type passport from 'passport';
import type { Config } from '../config';
import type { Db } from '../db/knex';
import type { Logger } from '../logger';

export type ComponentStatus = { status: 'ok' | 'down' | 'not_configured'; detail?: string };

/** Everything the HTTP layer needs from the process that hosts it (the server, or a test). */
export interface AppDeps {
  config: Config;
  db: Db;
  logger: Logger;
  passport: passport.PassportStatic;
  sessionCookie: string;
  /** How the background queues are doing; supplied by worker/queues.ts when queues run. */
  queueStatus: () => Promise<ComponentStatus>;
}
