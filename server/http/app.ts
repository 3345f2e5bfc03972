import express, { type Express } from 'express';
import helmet from 'helmet';
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
import { requestLog } from './request-log';
import { routeTable } from './route-table';
import { staticClient } from './static-client';

export interface AppOptions {
  config: Config;
  db: Db;
  logger?: Logger;
  queues?: Queues;
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
  };

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.trustProxy ? 1 : false);
  app.use(
    helmet({
      strictTransportSecurity: config.isProduction,
      contentSecurityPolicy: {
        directives: { 'upgrade-insecure-requests': config.isProduction ? [] : null },
      },
    }),
  );
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
  api.use(bearerAuthentication(db, logger));
  mountRoutes(api, routeTable(deps));
  api.use(apiNotFound);
  api.use(errorHandler);

  app.use('/api', api);
  app.use(staticClient());
  return { app, deps };
}
