/** The auth feature's hand-written SQL; every value arrives as a bind parameter. */

/**
 * A live session ($1, the plain pool's numbering) with the user it is signed in as: null columns
 * when nobody is signed in with it or the account is gone.
 */
export const SESSION_WITH_USER = `
  SELECT s.sess::text AS sess, s.expire, u.id, u.email, u.display_name AS "displayName", u.units
    FROM "session" s
    LEFT JOIN users u ON u.id = CASE WHEN json_typeof(s.sess #> '{passport,user}') = 'number'
                                     THEN (s.sess #>> '{passport,user}')::int END
   WHERE s.sid = $1 AND s.expire >= now()`;

/** The signed-in person's fields the session user carries, for $id. */
export const SESSION_USER = 'SELECT id, email, display_name AS "displayName", units FROM users WHERE id = $id';

/** Ends every session signed in as $userId but $keep, answering the ended ids. */
export const END_SESSIONS = `DELETE FROM session WHERE (sess->'passport'->>'user')::int = $userId AND sid IS DISTINCT FROM $keep RETURNING sid`;
