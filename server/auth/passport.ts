import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { QueryTypes } from 'sequelize';
import { normaliseEmail } from '@shared/schemas/auth';
import { User } from '../db/models';
import { decoyVerify, verifyPassword } from './passwords';
import { preloadedUser } from './session';
import { SESSION_USER } from './auth.queries';
import type { Request } from 'express';
import type { AppDeps } from '../deps';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // The signed-in person, as loaded by deserializeUser.
    interface User {
      id: number;
      email: string;
      displayName: string;
      units: 'in' | 'mm';
    }
  }
}

/**
 * The connection the user fallback below reads through. Passport is one instance per process and keeps
 * every deserializer it was given, the first one answering, so the deserializer reads the connection
 * of the app configured last (as the models do) rather than capturing the first app's.
 */
let connection: AppDeps['sequelize'] | undefined;

/** Configures the one passport instance: e-mail + password, sessions keyed by user id. */
export function configurePassport(deps: Pick<AppDeps, 'sequelize'>) {
  connection = deps.sequelize;
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      User.findOne({ where: { email: normaliseEmail(email) } })
        .then(async (user) => {
          if (!user) {
            await decoyVerify(password);
            return done(null, false);
          }
          const ok = await verifyPassword(user.passwordHash, password);
          return ok ? done(null, toSessionUser(user)) : done(null, false);
        })
        .catch(done);
    }),
  );
  passport.serializeUser((user, done) => done(null, user.id));
  // Runs on every signed-in request; the session store has usually read the user with the session.
  passport.deserializeUser((req: Request, id: number, done: (err: unknown, user?: Express.User | false) => void) => {
    const known = preloadedUser(req, id);
    if (known !== undefined) return done(null, known ?? false);
    connection!
      .query<Express.User>(SESSION_USER, {
        bind: { id },
        type: QueryTypes.SELECT,
      })
      .then(([user]) =>
        done(null, user ? { id: user.id, email: user.email, displayName: user.displayName, units: user.units } : false),
      )
      .catch(done);
  });
  return passport;
}

export function toSessionUser(user: User): Express.User {
  return { id: user.id, email: user.email, displayName: user.displayName, units: user.units };
}
