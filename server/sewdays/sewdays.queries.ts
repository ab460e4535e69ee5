/** The sew days feature's hand-written SQL; every value arrives as a bind parameter. */

/** Records $userId's $answer to sew day $sewDayId, replacing an earlier one. */
export const UPSERT_RSVP = `INSERT INTO rsvps (sew_day_id, user_id, answer, created_at, updated_at) VALUES ($sewDayId, $userId, $answer, now(), now())
     ON CONFLICT (sew_day_id, user_id) DO UPDATE SET answer = EXCLUDED.answer, updated_at = now()`;

/**
 * A sew day's row as its answer shows it (sew day aliased d, its creator u): the answers counted by
 * kind, the answer of $userId and the day's chat room.
 */
const SEW_DAY_ROW = `d.id, d.guild_id AS "guildId", d.title, d.starts_at AS "startsAt", d.ends_at AS "endsAt", d.place,
         d.video_url AS "videoUrl", d.notes, d.cancelled_at AS "cancelledAt",
         u.id AS "creatorId", u.display_name AS "creatorName",
         (SELECT json_object_agg(c.answer, c.n)
            FROM (SELECT answer, count(*)::int AS n FROM rsvps WHERE sew_day_id = d.id GROUP BY answer) c) AS "rsvpCounts",
         (SELECT answer FROM rsvps WHERE sew_day_id = d.id AND user_id = $userId) AS "myRsvp",
         (SELECT min(id) FROM chat_rooms WHERE sew_day_id = d.id) AS "chatRoomId"`;

/**
 * Guild $guildId's time zone and its sew days as JSON rows, in one statement: `upcoming` (not yet ended
 * at $now, soonest first) or past (most recent first), at most 100.
 */
const sewDayListOf = (when: 'upcoming' | 'past') => {
  const [ended, order] = when === 'upcoming' ? ['>=', 'ASC'] : ['<', 'DESC'];
  return `SELECT g.time_zone AS "timeZone",
         coalesce((SELECT json_agg(x ORDER BY x."startsAt" ${order}, x.id)
                     FROM (SELECT ${SEW_DAY_ROW}
                             FROM sew_days d LEFT JOIN users u ON u.id = d.created_by_id
                            WHERE d.guild_id = g.id AND d.ends_at ${ended} $now
                            ORDER BY d.starts_at ${order}, d.id LIMIT 100) x), '[]') AS "sewDays"
    FROM guilds g WHERE g.id = $guildId`;
};
export const SEW_DAY_LIST = { upcoming: sewDayListOf('upcoming'), past: sewDayListOf('past') } as const;

/** Sew day $sewDayId as its page shows it: its row, its guild's time zone and everyone's answers by name. */
export const SEW_DAY_DETAIL = `SELECT ${SEW_DAY_ROW},
         (SELECT g.time_zone FROM guilds g WHERE g.id = d.guild_id) AS "timeZone",
         coalesce((SELECT json_agg(json_build_object('userId', r.user_id, 'displayName', ru.display_name, 'answer', r.answer)
                                   ORDER BY ru.display_name)
                     FROM rsvps r JOIN users ru ON ru.id = r.user_id WHERE r.sew_day_id = d.id), '[]') AS rsvps
    FROM sew_days d LEFT JOIN users u ON u.id = d.created_by_id
   WHERE d.id = $sewDayId`;
