import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import type pg from 'pg';
import type { Config } from '../config';

export const SESSION_COOKIE = 'blockpost.sid';

/** Sessions live in PostgreSQL so any app node can serve any request. */
export function createSessionMiddleware(config: Config, pool: pg.Pool) {
  const PgStore = connectPgSimple(session);
  return session({
    name: SESSION_COOKIE,
    // No touch: a rolling expiry would write the session row on every request (one UPDATE per page
    // load and per API call); a session instead lasts 30 days from sign-in.
    store: new PgStore({
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
