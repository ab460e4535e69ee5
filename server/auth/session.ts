import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import type { Request } from 'express';
import type pg from 'pg';
import type { Config } from '../config';
import { SESSION_WITH_USER } from './auth.queries';
import type { CachedSession, SessionCache } from './session-cache';

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

type StoredSession = session.SessionData & { passport?: { user?: unknown }; [USER]?: PreloadedUser };

/** A fresh copy of the session for one request (handlers change `req.session` in place). */
function sessionFrom(found: CachedSession): StoredSession {
  const sess = JSON.parse(found.sess) as StoredSession;
  const id = sess.passport?.user;
  if (typeof id === 'number') sess[USER] = { id, user: found.user };
  return sess;
}

/**
 * Sessions live in PostgreSQL so any app node can serve any request. The store reads the session's
 * user in the same query as the session: every signed-in request needs both, and one round trip
 * instead of two is most of what the session costs. The statement is named, so PostgreSQL keeps its plan.
 * What it read is kept for a second (`SessionCache`): a person's requests in the same second (a page's
 * several calls, an intake station measuring) read the row once; a session changed or ended here is
 * forgotten at once, and on other nodes as soon as the live adapter tells them.
 */
export function createSessionMiddleware(config: Config, pool: pg.Pool, cache: SessionCache) {
  const PgStore = connectPgSimple(session);
  class PgStoreWithUser extends PgStore {
    override get(sid: string, fn: (err: unknown, sess?: session.SessionData | null) => void) {
      const cached = cache.get(sid);
      if (cached) return fn(null, sessionFrom(cached));
      const readStartedAt = cache.beginRead();
      pool.query({ name: 'session-with-user', text: SESSION_WITH_USER, values: [sid] }).then(({ rows: [row] }) => {
        if (!row) return fn(null, null);
        const found: CachedSession = {
          sess: row.sess as string,
          userId: (row.id as number | null) ?? null,
          user: row.id == null ? null : { id: row.id, email: row.email, displayName: row.displayName, units: row.units },
          expiresAt: new Date(row.expire as Date).getTime(),
        };
        cache.keep(sid, found, readStartedAt);
        fn(null, sessionFrom(found));
      }, fn);
    }

    override set(sid: string, sess: session.SessionData, fn?: (err?: unknown) => void) {
      cache.forget([sid]);
      super.set(sid, sess, fn);
    }

    override destroy(sid: string, fn?: (err?: unknown) => void) {
      cache.forget([sid]);
      super.destroy(sid, fn);
    }

    override createSession(req: Request, sess: StoredSession) {
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
