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
    store: new PgStore({ pool, tableName: 'session', pruneSessionInterval: config.NODE_ENV === 'test' ? false : 15 * 60 }),
    secret: config.SESSION_SECRET,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: config.PUBLIC_URL.startsWith('https://'),
      maxAge: 30 * 24 * 60 * 60 * 1000,
    },
  });
}
