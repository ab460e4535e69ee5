import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import type { Request } from 'express';
import type pg from 'pg';
import type { Config } from '../config';
import { SESSION_WITH_USER } from './auth.queries';

export const SESSION_COOKIE = 'blockpost.sid';

/** The signed-in person read with the session row; `user` is null when the account is gone. */
interface PreloadedUser {
  id: number;
  user: Express.User | null;
}

// The user read with a session, handed from the store to passport's deserializeUser for one request.
const preloaded = new WeakMap<Request, PreloadedUser>();
// A symbol key is neither copied into req.session nor written back to the store.
const USER = Symbol('preloaded user');

/** The user the session store read together with this request's session, if it did. */
export function preloadedUser(req: Request, id: number): Express.User | null | undefined {
  const found = preloaded.get(req);
  return found && found.id === id ? found.user : undefined;
}

/**
 * Sessions live in PostgreSQL so any app node can serve any request. The store reads the session's
 * user in the same query as the session: every signed-in request needs both, and one round trip
 * instead of two is most of what the session costs. The statement is named, so PostgreSQL keeps its plan.
 */
export function createSessionMiddleware(config: Config, pool: pg.Pool) {
  const PgStore = connectPgSimple(session);
  class PgStoreWithUser extends PgStore {
    override get(sid: string, fn: (err: unknown, sess?: session.SessionData | null) => void) {
      pool.query({ name: 'session-with-user', text: SESSION_WITH_USER, values: [sid] }).then(({ rows: [row] }) => {
        if (!row) return fn(null, null);
        const sess = (typeof row.sess === 'string' ? JSON.parse(row.sess) : row.sess) as session.SessionData & {
          passport?: { user?: unknown };
          [USER]?: PreloadedUser;
        };
        const id = sess.passport?.user;
        if (typeof id === 'number') {
          const user: Express.User | null =
            row.id == null ? null : { id: row.id, email: row.email, displayName: row.displayName, units: row.units };
          sess[USER] = { id, user };
        }
        fn(null, sess);
      }, fn);
    }

    override createSession(req: Request, sess: session.SessionData & { [USER]?: PreloadedUser }) {
      const user = sess[USER];
      if (user) preloaded.set(req, user);
      delete sess[USER];
      return super.createSession(req, sess);
    }
  }
  return session({
    name: SESSION_COOKIE,
    // No touch: a rolling expiry would write the session row on every request (one UPDATE per page
    // load and per API call); a session instead lasts 30 days from sign-in.
    store: new PgStoreWithUser({
      pool,
      tableName: 'session',
      disableTouch: true,
      pruneSessionInterval: config.NODE_ENV === 'test' ? false : 15 * 60,
    }),
    secret: config.SESSION_SECRET,
    resave: false,
    saveUninitialized: false,
    rolling: false,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: config.PUBLIC_URL.startsWith('https://'),
      maxAge: 30 * 24 * 60 * 60 * 1000,
    },
  });
}
