import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { RequestHandler } from 'express';
import session from 'express-session';
import type { Config } from '../config';
import type { Db } from '../db/knex';

export const sessionCookieName = (config: Pick<Config, 'isProduction'>): string =>
  // __Host- makes the browser insist on Secure, Path=/ and no Domain (RFC 6265bis §4.1.3.2).
  config.isProduction ? '__Host-dipdeck.sid' : 'dipdeck.sid';

/** How long a session read is reused; see SessionStore. */
export const SESSION_CACHE_MS = 5_000;

type Callback = (error?: unknown, session?: session.SessionData | null) => void;

/**
 * Sessions live in the `sessions` table, through the Knex store, with two savings for the request
 * path. Reads are kept for SESSION_CACHE_MS: reading the row was, with the person's, most of the
 * cost of a small API request. This process's own writes and sign-outs update the copy at once; a
 * sign-out handled by another server process shows here within that time. And each session's expiry
 * is touched at most once a minute: a rolling session would otherwise cost a write on every request,
 * and the idle timeout is days, not seconds.
 *
 * The idle timeout is the cookie's rolling max-age (and the row's expiry); the absolute timeout is
 * checked against the sign-in time in server/auth/passport.ts.
 */
class SessionStore extends ConnectSessionKnexStore {
  private readonly touchedAt = new Map<string, number>();
  private readonly recent = new Map<string, { json: string; expiresAt: number; readAt: number }>();

  constructor(options: ConstructorParameters<typeof ConnectSessionKnexStore>[0]) {
    super(options);
    // The base store asks once whether its table exists and keeps the answer: a database away at that
    // moment became a rejection nobody awaited and the failure of every later request. Our migrations
    // make the table, so there is nothing to wait for.
    this.ready.catch(() => {});
    this.ready = Promise.resolve();
  }

  private remember(sid: string, data: session.SessionData): void {
    if (this.recent.size >= 50_000) this.recent.clear();
    const expires = data.cookie?.expires;
    const expiresAt = expires ? new Date(expires).getTime() : Number.POSITIVE_INFINITY;
    this.recent.set(sid, { json: JSON.stringify(data), expiresAt, readAt: Date.now() });
  }

  override async get(sid: string, callback?: Callback): Promise<session.SessionData | null> {
    const now = Date.now();
    const kept = this.recent.get(sid);
    if (kept && now - kept.readAt < SESSION_CACHE_MS && kept.expiresAt > now) {
      // A fresh object each time: express-session changes the session it is given.
      const data = JSON.parse(kept.json) as session.SessionData;
      callback?.(null, data);
      return data;
    }
    this.recent.delete(sid);
    try {
      const data = (await super.get(sid, () => {})) as session.SessionData | null;
      if (data) this.remember(sid, data);
      callback?.(null, data);
      return data;
    } catch (error) {
      callback?.(error);
      return null;
    }
  }

  override async set(sid: string, data: session.SessionData, callback?: (error?: unknown) => void) {
    this.recent.delete(sid);
    try {
      await super.set(sid, data);
      this.remember(sid, data);
      callback?.();
    } catch (error) {
      callback?.(error);
    }
  }

  override async destroy(sid: string, callback?: (error?: unknown) => void) {
    this.recent.delete(sid);
    this.touchedAt.delete(sid);
    try {
      const result = await super.destroy(sid);
      callback?.();
      return result;
    } catch (error) {
      callback?.(error);
      return 0;
    }
  }

  override async touch(sid: string, data: session.SessionData, callback?: () => void): Promise<void> {
    const now = Date.now();
    const last = this.touchedAt.get(sid);
    if (last !== undefined && now - last < 60_000) {
      callback?.();
      return;
    }
    if (this.touchedAt.size > 50_000) this.touchedAt.clear();
    this.touchedAt.set(sid, now);
    const kept = this.recent.get(sid);
    if (kept && data.cookie?.expires) kept.expiresAt = new Date(data.cookie.expires).getTime();
    // The base store neither catches nor calls back on an error: the answer would never end, and the
    // rejection nobody awaits would stop the process (a busy or unreachable database, say).
    try {
      await super.touch(sid, data);
      callback?.();
    } catch (error) {
      this.touchedAt.delete(sid);
      (callback as ((error?: unknown) => void) | undefined)?.(error);
    }
  }
}

export function sessionMiddleware(config: Config, db: Db, secret: string): RequestHandler {
  const store = new SessionStore({
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
