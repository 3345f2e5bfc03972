import express, { type Express } from 'express';
import type { Redis } from 'ioredis';
import type { Queues } from '../../worker/queues';
import { bearerAuthentication } from '../auth/bearer';
import { createPassport } from '../auth/passport';
import { sessionCookieName, sessionMiddleware } from '../auth/session';
import { resolveSessionSecret } from '../auth/session-secret';
import type { Config } from '../config';
import type { Db } from '../db/knex';
import { createLogger, type Logger } from '../logger';
import { createRescoreRequests } from '../services/consensus/request-rescore';
import type { AppDeps } from './app-deps';
import { mountRoutes } from './define-route';
import { apiNotFound, errorHandler } from './error-handler';
import { createRateLimits, type RateLimitOptions } from './rate-limits';
import { requestLog } from './request-log';
import { routeTable } from './route-table';
import { securityHeaders } from './security-headers';
import { staticClient } from './static-client';

export interface AppOptions {
  config: Config;
  db: Db;
  logger?: Logger;
  queues?: Queues;
  /** Where the abuse limits count: Redis (shared by every server process) or, absent, this process. */
  rateLimitRedis?: Redis;
  /** Other numbers for some abuse limits (tests). */
  rateLimitOverrides?: RateLimitOptions['overrides'];
}

/** Builds the Express app without listening, so that tests drive it with supertest. */
export function createApp(options: AppOptions): { app: Express; deps: AppDeps } {
  const { config, db } = options;
  const logger = options.logger ?? createLogger(config);
  const deps: AppDeps = {
    config,
    db,
    logger,
    passport: createPassport(db, config),
    sessionCookie: sessionCookieName(config),
    queues: options.queues,
    rescoreRequests: createRescoreRequests(options.queues, logger),
    rateLimits: createRateLimits({
      logger,
      redis: options.rateLimitRedis,
      prefix: config.queuePrefix,
      overrides: options.rateLimitOverrides,
    }),
  };

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.trustProxy ? 1 : false);
  app.use(securityHeaders(config));
  app.use(requestLog(logger));

  const api = express.Router();
  api.use(express.json({ limit: '1mb' }));
  api.use((_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  api.use(sessionMiddleware(config, db, resolveSessionSecret(config.sessionSecret, config.dataDir)));
  api.use(deps.passport.initialize());
  api.use(deps.passport.session());
  api.use(deps.rateLimits.tokenFailuresPerIp, deps.rateLimits.tokenUsePerToken);
  api.use(bearerAuthentication(db, logger));
  mountRoutes(api, routeTable(deps));
  api.use(apiNotFound);
  api.use(errorHandler);

  app.use('/api', api);
  app.use(staticClient());
  return { app, deps };
}
