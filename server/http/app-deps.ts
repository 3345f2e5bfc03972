import type passport from 'passport';
import type { Queues } from '../../worker/queues';
import type { Config } from '../config';
import type { Db } from '../db/knex';
import type { Logger } from '../logger';
import type { RescoreRequests } from '../services/consensus/request-rescore';
import type { RateLimits } from './rate-limits';

export type ComponentStatus = { status: 'ok' | 'down' | 'not_configured'; detail?: string };

/** Everything the HTTP layer needs from the process that hosts it (the server, or a test). */
export interface AppDeps {
  config: Config;
  db: Db;
  logger: Logger;
  passport: passport.PassportStatic;
  sessionCookie: string;
  /** The background queues, to enqueue work and report on jobs; absent in a bare test app. */
  queues: Queues | undefined;
  /** The abuse limits, for the routes that use them (sign-in, sign-up, password reset, token use). */
  rateLimits: RateLimits;
  /** Asks for a rescore of a campaign's changed snippets (coalesced; a no-op without queues). */
  rescoreRequests: RescoreRequests;
}
