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
/**
 * The Knex store, touching each session's expiry at most once a minute: a rolling session would
 * otherwise cost a database write on every request, and the idle timeout is days, not seconds.
 */
class ThrottledTouchStore extends ConnectSessionKnexStore {
  private readonly touchedAt = new Map<string, number>();

  override async touch(sid: string, session: session.SessionData, callback?: () => void): Promise<void> {
    const now = Date.now();
    const last = this.touchedAt.get(sid);
    if (last !== undefined && now - last < 60_000) {
      callback?.();
      return;
    }
    if (this.touchedAt.size > 50_000) this.touchedAt.clear();
    this.touchedAt.set(sid, now);
    return super.touch(sid, session, callback);
  }
}

export function sessionMiddleware(config: Config, db: Db, secret: string): RequestHandler {
  const store = new ThrottledTouchStore({
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
