/** Hand-written SQL of the home screen, bind parameters only; every query is limited to the caller's active memberships. */
import type pg from 'pg';
import { QueryTypes, type Sequelize } from 'sequelize';
import { oneTripRead } from '../db/one-trip';

const MINE = `JOIN memberships m ON m.guild_id = g.id AND m.user_id = $userId AND m.status = 'active'`;
const OFFICER = `${MINE} AND m.role IN ('admin', 'coordinator')`;
const LIMIT = 50;

interface GuildCols {
  guild_id: number;
  guild_name: string;
  time_zone: string;
}

export interface OwedRow extends GuildCols {
  swap_id: number;
  swap_title: string;
  due_at: Date;
  block_id: number;
  sequence: number;
  state: 'pledged' | 'sewn';
}

export interface OpenSwapRow extends GuildCols {
  swap_id: number;
  swap_title: string;
  signup_closes_at: Date;
  pledged: number | null;
}

export interface SewDayRow extends GuildCols {
  sew_day_id: number;
  title: string;
  starts_at: Date;
  ends_at: Date;
  answer: 'going' | 'maybe' | 'no' | null;
}

export interface SwapCountRow extends GuildCols {
  swap_id: number;
  swap_title: string;
  due_at: Date;
  count: string;
}

export interface UnreadRow extends GuildCols {
  room_id: number;
  kind: 'sewday' | 'swap';
  owner_id: number;
  title: string;
  unread: string;
}

/** Blocks the caller still has to sew or hand in, in swaps that are collecting them. */
const OWED_BLOCKS = `SELECT g.id AS guild_id, g.name AS guild_name, g.time_zone, s.id AS swap_id, s.title AS swap_title, s.due_at,
            b.id AS block_id, b.sequence, b.state
       FROM blocks b JOIN swaps s ON s.id = b.swap_id JOIN guilds g ON g.id = s.guild_id ${MINE}
      WHERE b.maker_id = $userId AND b.state IN ('pledged', 'sewn') AND s.state IN ('sewing', 'collecting')
      ORDER BY s.due_at, s.id, b.sequence
      LIMIT 500`;

/** Swaps open for sign-up, with what the caller pledged (null when not signed up). */
const OPEN_SWAPS = `SELECT g.id AS guild_id, g.name AS guild_name, g.time_zone, s.id AS swap_id, s.title AS swap_title, s.signup_closes_at,
            su.blocks AS pledged
       FROM swaps s JOIN guilds g ON g.id = s.guild_id ${MINE}
       LEFT JOIN signups su ON su.swap_id = s.id AND su.user_id = $userId AND su.status = 'active'
      WHERE s.state = 'signup'
      ORDER BY s.signup_closes_at, s.id
      LIMIT ${LIMIT}`;

/** The next sew day of each guild (one not yet over and not cancelled), with the caller's answer. */
const NEXT_SEW_DAYS = `SELECT * FROM (
       SELECT DISTINCT ON (g.id) g.id AS guild_id, g.name AS guild_name, g.time_zone, d.id AS sew_day_id, d.title,
              d.starts_at, d.ends_at, r.answer
         FROM sew_days d JOIN guilds g ON g.id = d.guild_id ${MINE}
         LEFT JOIN rsvps r ON r.sew_day_id = d.id AND r.user_id = $userId
        WHERE d.cancelled_at IS NULL AND d.ends_at > now()
        ORDER BY g.id, d.starts_at, d.id) next
      ORDER BY starts_at`;

/** Blocks given to the caller in a return, per swap, for swaps still sorting or finished in the last 60 days. */
const BLOCKS_COMING_BACK = `SELECT g.id AS guild_id, g.name AS guild_name, g.time_zone, s.id AS swap_id, s.title AS swap_title, s.due_at,
            count(*) AS count
       FROM blocks b JOIN swaps s ON s.id = b.swap_id JOIN guilds g ON g.id = s.guild_id ${MINE}
      WHERE b.recipient_id = $userId AND b.state = 'returned'
        AND (s.state = 'sorting' OR b.returned_at > now() - interval '60 days')
      GROUP BY g.id, s.id
      ORDER BY max(b.returned_at) DESC NULLS LAST
      LIMIT ${LIMIT}`;

/**
 * Chat rooms with messages from others since the caller last looked (or, never opened, since they
 * joined the guild). Sew-day rooms count while the day is not long past; swap rooms while the swap runs
 * (a draft swap's room only for officers).
 */
const UNREAD_ROOMS = `SELECT g.id AS guild_id, g.name AS guild_name, g.time_zone, r.id AS room_id, r.kind,
            coalesce(r.sew_day_id, r.swap_id) AS owner_id, coalesce(d.title, s.title) AS title, count(*) AS unread
       FROM chat_rooms r JOIN guilds g ON g.id = r.guild_id ${MINE}
       LEFT JOIN sew_days d ON d.id = r.sew_day_id
       LEFT JOIN swaps s ON s.id = r.swap_id
       LEFT JOIN chat_reads cr ON cr.room_id = r.id AND cr.user_id = $userId
       JOIN chat_messages msg ON msg.room_id = r.id AND msg.author_id <> $userId AND msg.deleted_at IS NULL
                             AND msg.created_at > coalesce(cr.read_at, m.created_at)
      WHERE (r.kind = 'sewday' AND d.cancelled_at IS NULL AND d.ends_at > now() - interval '14 days')
         OR (r.kind = 'swap' AND s.state NOT IN ('complete', 'cancelled') AND (s.state <> 'draft' OR m.role IN ('admin', 'coordinator')))
      GROUP BY g.id, r.id, d.title, s.title
      ORDER BY max(msg.created_at) DESC
      LIMIT ${LIMIT}`;

/** For officers: blocks handed in and waiting to be received, per swap. */
const BLOCKS_TO_RECEIVE = `SELECT g.id AS guild_id, g.name AS guild_name, g.time_zone, s.id AS swap_id, s.title AS swap_title, s.due_at,
            count(*) AS count
       FROM blocks b JOIN swaps s ON s.id = b.swap_id JOIN guilds g ON g.id = s.guild_id ${OFFICER}
      WHERE b.state = 'handed_in' AND s.state IN ('sewing', 'collecting', 'sorting')
      GROUP BY g.id, s.id
      ORDER BY s.due_at, s.id
      LIMIT ${LIMIT}`;

/** For officers: swaps whose due date has passed while blocks are still owed, with how many. */
const OVERDUE_SWAPS = `SELECT g.id AS guild_id, g.name AS guild_name, g.time_zone, s.id AS swap_id, s.title AS swap_title, s.due_at,
            count(b.id) AS count
       FROM swaps s JOIN guilds g ON g.id = s.guild_id ${OFFICER}
       LEFT JOIN blocks b ON b.swap_id = s.id AND b.state IN ('pledged', 'sewn')
      WHERE s.state IN ('sewing', 'collecting') AND s.due_at < now()
      GROUP BY g.id, s.id
      ORDER BY s.due_at, s.id
      LIMIT ${LIMIT}`;

/** Every read of the home screen, in the order `homeReads` answers them. */
const HOME_READS = [
  { name: 'home_owed_blocks', sql: OWED_BLOCKS },
  { name: 'home_open_swaps', sql: OPEN_SWAPS },
  { name: 'home_next_sew_days', sql: NEXT_SEW_DAYS },
  { name: 'home_blocks_coming_back', sql: BLOCKS_COMING_BACK },
  { name: 'home_unread_rooms', sql: UNREAD_ROOMS },
  { name: 'home_blocks_to_receive', sql: BLOCKS_TO_RECEIVE },
  { name: 'home_overdue_swaps', sql: OVERDUE_SWAPS },
];

/**
 * The seven reads of the home screen in one round trip, each a named statement on the plain pool
 * (`oneTripRead`): PostgreSQL keeps their plans, where Sequelize sent seven queries planned anew.
 */
export async function homeReads(pool: pg.Pool, userId: number) {
  const [owed, open, days, back, rooms, toReceive, overdue] = await oneTripRead(
    pool,
    HOME_READS.map(({ name, sql }) => ({ name, text: sql.replaceAll('$userId', '$1'), values: [userId] })),
  );
  return {
    owed: owed as unknown as OwedRow[],
    open: open as unknown as OpenSwapRow[],
    days: days as unknown as SewDayRow[],
    back: back as unknown as SwapCountRow[],
    rooms: rooms as unknown as UnreadRow[],
    toReceive: toReceive as unknown as SwapCountRow[],
    overdue: overdue as unknown as SwapCountRow[],
  };
}

/** Marks a room read up to now for the caller. */
export async function markRoomSeen(sequelize: Sequelize, roomId: number, userId: number): Promise<Date> {
  const [row] = await sequelize.query<{ read_at: Date }>(
    `INSERT INTO chat_reads (room_id, user_id, read_at) VALUES ($roomId, $userId, now())
     ON CONFLICT (room_id, user_id) DO UPDATE SET read_at = excluded.read_at
     RETURNING read_at`,
    { bind: { roomId, userId }, type: QueryTypes.SELECT },
  );
  return new Date(row!.read_at);
}
