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

/**
 * The signed-in person ($userId) as /api/me and /api/session answer: their own fields and their active
 * memberships with each guild's name and default unit, oldest first, in one statement (the client asks
 * on every start).
 */
export const ME = `SELECT u.id, u.email, u.display_name AS "displayName", u.units, u.mailing_address AS "mailingAddress",
         u.units_chosen AS "unitsChosen",
         coalesce((SELECT json_agg(json_build_object('guildId', g.id, 'guildName', g.name, 'role', m.role,
                                                     'defaultUnit', g.default_unit) ORDER BY m.created_at, m.id)
                     FROM memberships m JOIN guilds g ON g.id = m.guild_id
                    WHERE m.user_id = u.id AND m.status = 'active'), '[]') AS memberships
    FROM users u WHERE u.id = $userId`;
