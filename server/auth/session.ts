import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { RequestHandler } from 'express';
import session from 'express-session';
import type { Config } from '../config';
import type { Db } from '../db/knex';

export const sessionCookieName = (config: Pick<Config, 'isProduction'>): string =>
  // __Host- makes the browser insist on Secure, Path=/ and no Domain (RFC 6265bis §4.1.3.2).
  config.isProduction ? '__Host-dipdeck.sid' : 'dipdeck.sid';

/**
 * Sessions live in the `sessions` table. The idle timeout is the cookie's rolling max-age (and the
 * row's expiry); the absolute timeout is checked against the sign-in time in server/auth/passport.ts.
 */
export function sessionMiddleware(config: Config, db: Db, secret: string): RequestHandler {
  const store = new ConnectSessionKnexStore({
    knex: db,
    tableName: 'sessions',
    createTable: false,
    cleanupInterval: 0, // the housekeeping job deletes expired sessions (worker/processors/housekeeping.ts)
  });
  return session({
    name: sessionCookieName(config),
    secret,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    proxy: config.trustProxy,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: config.isProduction,
      path: '/',
      maxAge: config.sessionIdleMs,
    },
  });
}
