/** The sew days feature's hand-written SQL; every value arrives as a bind parameter. */

/** Answers counted per sew day in $ids and per answer. */
export const RSVP_COUNTS =
  'SELECT sew_day_id, answer, count(*) AS n FROM rsvps WHERE sew_day_id = ANY($ids::int[]) GROUP BY sew_day_id, answer';

/** Records $userId's $answer to sew day $sewDayId, replacing an earlier one. */
export const UPSERT_RSVP = `INSERT INTO rsvps (sew_day_id, user_id, answer, created_at, updated_at) VALUES ($sewDayId, $userId, $answer, now(), now())
     ON CONFLICT (sew_day_id, user_id) DO UPDATE SET answer = EXCLUDED.answer, updated_at = now()`;
