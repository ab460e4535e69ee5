/** The chat feature's hand-written SQL; every value arrives as a bind parameter. */
import { ChatRoom } from '../db/models';
import { modelColumns, sqlOnce } from '../db/model-columns';
import { roleIn } from '../guilds/guilds.queries';

/**
 * Room $roomId with what deciding access to it needs, in one statement: the role of $userId in its
 * guild, and the title and state of the sew day or swap it belongs to (a swap's room follows the
 * swap's visibility). Every read of a room's history and every message sent asks it.
 */
export const roomWithAccess = sqlOnce(
  () => `SELECT ${modelColumns(ChatRoom, 'r')}, ${roleIn('r.guild_id')} AS "viewerRole",
         d.title AS "sewDayTitle", s.title AS "swapTitle", s.state AS "swapState"
    FROM chat_rooms r
    LEFT JOIN sew_days d ON d.id = r.sew_day_id
    LEFT JOIN swaps s ON s.id = r.swap_id
   WHERE r.id = $roomId`,
);

/**
 * Swap $swapId's room, opened by this statement when it has none yet ($guildId is the swap's guild).
 * The common case, a room that exists, writes nothing. Two people opening it at once: the one whose
 * insert loses gets no row here (its snapshot sees neither room) and reads it again.
 */
export const swapRoomOpened = sqlOnce(
  () => `WITH opened AS (
    INSERT INTO chat_rooms (guild_id, kind, swap_id, created_at, updated_at)
    SELECT $guildId, 'swap', $swapId, now(), now()
     WHERE NOT EXISTS (SELECT 1 FROM chat_rooms WHERE swap_id = $swapId)
    ON CONFLICT (swap_id) DO NOTHING
    RETURNING ${modelColumns(ChatRoom, 'chat_rooms')})
  SELECT * FROM opened
  UNION ALL
  SELECT ${modelColumns(ChatRoom, 'r')} FROM chat_rooms r WHERE r.swap_id = $swapId`,
);

/** A message with its author's name and, unless removed, its photos in order (null for none). */
const MESSAGE_ROW = `m.id, m.room_id AS "roomId", m.author_id AS "authorId", u.display_name AS "authorName", m.body,
         m.created_at AS "createdAt", m.edited_at AS "editedAt", m.deleted_at AS "deletedAt", m.deleted_by_id AS "deletedById",
         CASE WHEN m.deleted_at IS NULL THEN
           (SELECT json_agg(json_build_object('id', p.id, 'width', p.width, 'height', p.height) ORDER BY p.id)
              FROM photos p WHERE p.chat_message_id = m.id)
         END AS photos
    FROM chat_messages m LEFT JOIN users u ON u.id = m.author_id`;

/** The newest $limit messages of room $roomId, newest first; a second text for those older than $before. */
export const HISTORY_PAGE = {
  newest: `SELECT ${MESSAGE_ROW} WHERE m.room_id = $roomId ORDER BY m.id DESC LIMIT $limit`,
  before: `SELECT ${MESSAGE_ROW} WHERE m.room_id = $roomId AND m.id < $before ORDER BY m.id DESC LIMIT $limit`,
} as const;

/** Holds one person's posts in turn, on every node, until the transaction ends: the limit below counts under it. */
export const LOCK_SENDER = 'SELECT pg_advisory_xact_lock(7314005, $authorId)';

/**
 * Message $body by $authorId in room $roomId at $at, written only when its author posted fewer than
 * $limit messages since $since. One row: the message's id (null when refused) and the oldest of the
 * author's last $limit messages in the window, which says when the next may go.
 */
export const POST_WITHIN_LIMIT = `WITH recent AS (
    SELECT created_at FROM chat_messages
     WHERE author_id = $authorId::int AND created_at > $since::timestamptz
     ORDER BY created_at DESC LIMIT $limit::int),
  posted AS (
    INSERT INTO chat_messages (room_id, author_id, body, created_at, updated_at)
    SELECT $roomId::int, $authorId::int, $body::text, $at::timestamptz, $at::timestamptz
     WHERE (SELECT count(*) FROM recent) < $limit::int
    RETURNING id)
  SELECT (SELECT id FROM posted) AS id, (SELECT min(created_at) FROM recent) AS "oldestRecent"`;
