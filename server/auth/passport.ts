import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { Config } from '../config';
import type { Db } from '../db/knex';
import { findPersonForRequest, type PersonRow } from '../db/people';
import { checkCredentials } from '../services/auth/check-credentials';

declare global {
  namespace Express {
    interface User extends PersonRow {}
  }
}

/** What the session remembers: who, and when they signed in (for the absolute timeout). */
interface SessionUser {
  id: number;
  signedInAt: string;
}

export function createPassport(db: Db, config: Pick<Config, 'sessionAbsoluteMs'>): passport.PassportStatic {
  const instance = new passport.Passport() as unknown as passport.PassportStatic;

  instance.use(
    new LocalStrategy(
      { usernameField: 'email', passwordField: 'password', session: true },
      (email, password, done) => {
        checkCredentials(db, email, password).then(
          (person) => done(null, person),
          (error) => done(error),
        );
      },
    ),
  );

  instance.serializeUser((person, done) => {
    const user: SessionUser = { id: (person as PersonRow).id, signedInAt: new Date().toISOString() };
    done(null, user);
  });

  instance.deserializeUser((stored: SessionUser, done) => {
    const signedInAt = Date.parse(stored?.signedInAt ?? '');
    if (!Number.isFinite(signedInAt) || Date.now() - signedInAt > config.sessionAbsoluteMs) {
      done(null, false);
      return;
    }
    findPersonForRequest(db, stored.id).then((person) => {
      const revoked = person?.sessionsValidAfter && Date.parse(person.sessionsValidAfter) > signedInAt;
      done(null, person && !person.deletedAt && !revoked ? person : false);
    }, done);
  });

  return instance;
}
