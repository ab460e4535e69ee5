/** The board's hand-written SQL; every value arrives as a bind parameter. */
import { viewerRole } from '../swaps/swaps.queries';
import type { SwapReadExtra } from '../swaps/swaps.policy';

/**
 * The roster of swap $swapId, a member per active sign-up, each member as the tuple
 * `[userId, displayName, email, pledge, mailingAddress, blocks]`, the blocks by sequence, each
 * `[id, sequence, state, verdict, trimmed, acceptedByDecision, handInHow, handInNote, photoIds, estimate]`
 * (see `MemberTuple` in roster.service.ts). Arrays rather than objects: PostgreSQL spent a third of the
 * query writing the same keys for every block, and the answer read back is a third of the size. The
 * swap's blocks, their photos and their latest photo estimates are each read once and joined, rather
 * than looked up block by block. by_maker is MATERIALIZED so it is computed once: before a new swap's
 * rows have statistics the planner would otherwise re-aggregate it for every member.
 *
 * `rosterQuery('chunks')` answers the members in rows of up to ROSTER_CHUNK, in name order (each row's
 * `members`, or `alias`, the text of a JSON array), `rosterQuery('array')` one JSON array of them all. A whole roster is read in
 * chunks: as one value, a 600 × 6 roster is a 240 KB field that PostgreSQL builds and sends whole and the
 * app copies as it arrives and decodes as one string (on this kind of machine each allocation that large
 * costs page faults on both sides); a row per member costs the app a row's handling 600 times. The chunks
 * come as text, for the app to decode once the last has arrived: decoded as they arrive, their objects
 * outlived the young generation while the rest came in and took garbage collection from 9 to 20 % of
 * the app's time.
 */
const ROSTER_CHUNK = 50;
const rosterQuery = (shape: 'chunks' | 'array', members = '', gate = '', alias = 'members') => {
  const tuple = 'json_build_array(s.user_id, u.display_name, u.email, s.blocks, u.mailing_address, m.own)';
  const order = 'lower(u.display_name), u.id';
  const from = `signups s JOIN users u ON u.id = s.user_id LEFT JOIN by_maker m ON m.maker_id = s.user_id
   WHERE s.swap_id = $swapId AND s.status = 'active'${members && ` AND s.user_id = ${members}`}${gate && ` AND ${gate}`}`;
  return `WITH swap_blocks AS (
         SELECT id, maker_id, sequence, state, verdict, trimmed, accepted_at, hand_in_how, hand_in_note
           FROM blocks WHERE swap_id = $swapId${members && ` AND maker_id = ${members}`}),
       block_photos AS (
         SELECT p.block_id, array_agg(p.id ORDER BY p.created_at, p.id) AS ids
           FROM photos p JOIN swap_blocks b ON b.id = p.block_id GROUP BY p.block_id),
       latest AS (
         SELECT DISTINCT ON (e.block_id) e.id, e.block_id, e.verdict, e.width, e.height, e.expected_error, e.borderline, e.created_at
           FROM photo_estimates e JOIN swap_blocks b ON b.id = e.block_id
          ORDER BY e.block_id, e.created_at DESC, e.id DESC),
       by_maker AS MATERIALIZED (
         SELECT b.maker_id, json_agg(json_build_array(
                  b.id, b.sequence, b.state, b.verdict, b.trimmed, b.accepted_at IS NOT NULL, b.hand_in_how, b.hand_in_note,
                  p.ids, CASE WHEN latest.id IS NULL THEN NULL ELSE row_to_json(latest) END
                ) ORDER BY b.sequence) AS own
           FROM swap_blocks b
           LEFT JOIN block_photos p ON p.block_id = b.id
           LEFT JOIN latest ON latest.block_id = b.id
          GROUP BY b.maker_id)
  ${
    shape === 'array'
      ? `SELECT coalesce(json_agg(${tuple} ORDER BY ${order}), '[]') AS roster FROM ${from}`
      : `SELECT json_agg(r.member ORDER BY r.n)::text AS ${alias}
    FROM (SELECT ${tuple} AS member, row_number() OVER (ORDER BY ${order}) AS n FROM ${from}) r
   GROUP BY (r.n - 1) / ${ROSTER_CHUNK} ORDER BY (r.n - 1) / ${ROSTER_CHUNK}`
  }`;
};

/** Swap $1's roster in rows of `members` (see `rosterQuery`), numbered for a named statement on a pg client. */
export const ROSTER_CHUNKS = rosterQuery('chunks').replaceAll('$swapId', '$1');

/**
 * Part of swap $1's roster, for a board change: the rows of the members in $2 (an int array) as
 * `roster` (one array of the tuples ROSTER_CHUNKS answers in chunks), the number of active sign-ups as `members`, and as
 * `tallies` the swap's blocks grouped by what the totals count, `[state, verdict, trimmed,
 * acceptedByDecision, blocks]`. A change reads the rows it touched and a few tally lines instead of
 * every member's blocks, photos and estimates, so its cost does not grow with the swap.
 */
export const ROSTER_PART_POSITIONAL = `SELECT (${rosterQuery('array', 'ANY($2::int[])')}) AS roster,
       (SELECT count(*)::int FROM signups WHERE swap_id = $1 AND status = 'active') AS members,
       (SELECT coalesce(json_agg(json_build_array(t.state, t.verdict, t.trimmed, t.accepted, t.blocks)), '[]')
          FROM (SELECT b.state, b.verdict, b.trimmed, b.accepted_at IS NOT NULL AS accepted, count(*)::int AS blocks
                  FROM blocks b JOIN signups s ON s.swap_id = b.swap_id AND s.user_id = b.maker_id AND s.status = 'active'
                 WHERE b.swap_id = $1
                 GROUP BY 1, 2, 3, 4) t) AS tallies`.replaceAll('$swapId', '$1');

/**
 * The roster read with the swap policy's query, in the same message (`SwapReadExtra` in swaps.policy.ts),
 * so a roster request needs one round trip after the session's: swap $1's rows for person $2, none
 * unless $2 has a role in the swap's guild. The policy still decides on the swap's row as for any
 * swap request.
 */
export const ROSTER_WITH_SWAP: SwapReadExtra = {
  name: 'roster_for_viewer',
  column: 'roster',
  rows: rosterQuery(
    'chunks',
    '',
    `EXISTS (SELECT 1 FROM swaps "Swap" WHERE "Swap"."id" = $swapId AND ${viewerRole('Swap')} IS NOT NULL)`,
    'roster',
  )
    .replaceAll('$swapId', '$1')
    .replaceAll('$viewerId', '$2'),
};

/**
 * Activity lines in ($1, a JSON array with each line's place `n`) stamped $2, with their block's
 * number read on the way; they come back newest first with the names of who acted and whom it was about.
 * Numbered, for a named statement on the board fan-out's own pool. The block and the names are looked
 * up by key for each line: joined, the planner (which cannot tell how many lines the JSON holds) scanned
 * every block and user for a batch of a dozen lines, 2.5 ms a change under the API bench.
 */
export const RECORD_ACTIVITY = `WITH input AS (
       SELECT * FROM jsonb_to_recordset($1::jsonb)
                AS l(n int, guild_id int, swap_id int, kind text, actor_id int, subject_id int, block_id int, detail jsonb)),
     inserted AS (
       INSERT INTO swap_activities (guild_id, swap_id, kind, actor_id, subject_id, block_id, detail, created_at)
       SELECT l.guild_id, l.swap_id, l.kind, l.actor_id, l.subject_id, l.block_id,
              l.detail || coalesce((SELECT jsonb_build_object('sequence', b.sequence) FROM blocks b WHERE b.id = l.block_id), '{}'),
              $2
         FROM input l
        ORDER BY l.n
       RETURNING *)
     SELECT a.id, a.swap_id, a.kind, a.actor_id, (SELECT u.display_name FROM users u WHERE u.id = a.actor_id) AS actor_name,
            a.subject_id, (SELECT u.display_name FROM users u WHERE u.id = a.subject_id) AS subject_name,
            a.block_id, a.detail, a.created_at
       FROM inserted a
      ORDER BY a.id DESC`;

/**
 * What a swap's stored history says happened before its first activity line: moves between states,
 * pledges, blocks sewn, handed in, received and trimmed, and measurements that stand. A swap made
 * before lines were kept (the demo guild's, for one) is told from these; the minute of grace keeps
 * out the facts written in the same transaction as the first line, which that line already tells.
 * Each gets a negative id, the newest -1, so ids still fall from newest to oldest.
 */
const fromHistory = `
  WITH cut AS (
    SELECT COALESCE(MIN(created_at) - interval '1 minute', 'infinity'::timestamptz) AS at
      FROM swap_activities WHERE swap_id = $swapId),
  history AS (
    SELECT t.at, 1 AS src, t.id AS src_id,
           CASE WHEN t.from_state IS NULL THEN 'swap.created' ELSE 'swap.transitioned' END AS kind,
           t.by_id AS actor_id, NULL::int AS subject_id, NULL::int AS block_id,
           CASE WHEN t.from_state IS NULL THEN '{}'::jsonb ELSE jsonb_build_object('from', t.from_state, 'to', t.to_state) END AS detail
      FROM swap_transitions t WHERE t.swap_id = $swapId
    UNION ALL
    SELECT s.created_at, 2, s.id, 'signup.changed', s.user_id, s.user_id, NULL, jsonb_build_object('blocks', s.blocks)
      FROM signups s WHERE s.swap_id = $swapId
    UNION ALL
    SELECT b.sewn_at, 3, b.id, 'block.changed', b.maker_id, b.maker_id, b.id,
           jsonb_build_object('from', 'pledged', 'to', 'sewn', 'sequence', b.sequence)
      FROM blocks b WHERE b.swap_id = $swapId AND b.sewn_at IS NOT NULL
    UNION ALL
    SELECT b.handed_in_at, 4, b.id, 'block.changed', b.maker_id, b.maker_id, b.id,
           jsonb_build_object('from', 'sewn', 'to', 'handed_in', 'sequence', b.sequence)
      FROM blocks b WHERE b.swap_id = $swapId AND b.handed_in_at IS NOT NULL
    UNION ALL
    SELECT b.received_at, 5, b.id, 'block.changed', b.received_by_id, b.maker_id, b.id,
           jsonb_build_object('from', 'handed_in', 'to', 'received', 'sequence', b.sequence)
      FROM blocks b WHERE b.swap_id = $swapId AND b.received_at IS NOT NULL
    UNION ALL
    SELECT m.created_at, 6, m.id, 'block.measured', m.measured_by_id, b.maker_id, b.id,
           jsonb_build_object('verdict', m.verdict, 'source', m.source, 'sequence', b.sequence)
      FROM measurements m JOIN blocks b ON b.id = m.block_id
     WHERE b.swap_id = $swapId AND m.withdrawn_at IS NULL
    UNION ALL
    SELECT b.trimmed_at, 7, b.id, 'block.changed',
           (SELECT st.by_id FROM block_steps st
             WHERE st.block_id = b.id AND st.action = 'trimmed' AND st.undone_at IS NULL ORDER BY st.id DESC LIMIT 1),
           b.maker_id, b.id, jsonb_build_object('from', 'measured', 'to', 'measured', 'sequence', b.sequence)
      FROM blocks b WHERE b.swap_id = $swapId AND b.trimmed_at IS NOT NULL),
  derived AS (
    SELECT (-ROW_NUMBER() OVER (ORDER BY h.at DESC, h.src DESC, h.src_id DESC))::int AS id, h.*
      FROM history h, cut WHERE h.at < cut.at)`;

/**
 * A page of a swap's ($swapId) activity, newest first: its kept lines, then what its stored history tells
 * of the time before them; at most $limit lines with ids below $before.
 */
export const ACTIVITY_PAGE = `${fromHistory},
     lines AS (
       SELECT a.id, a.kind, a.actor_id, a.subject_id, a.block_id, a.detail, a.created_at
         FROM swap_activities a WHERE a.swap_id = $swapId AND a.id < $before
       UNION ALL
       SELECT d.id, d.kind, d.actor_id, d.subject_id, d.block_id, d.detail, d.at
         FROM derived d WHERE d.id < $before
       ORDER BY id DESC LIMIT $limit)
     SELECT l.id, $swapId::int AS swap_id, l.kind, l.actor_id, au.display_name AS actor_name,
            l.subject_id, su.display_name AS subject_name, l.block_id, l.detail, l.created_at
       FROM lines l LEFT JOIN users au ON au.id = l.actor_id LEFT JOIN users su ON su.id = l.subject_id
      ORDER BY l.id DESC`;

/**
 * Takes the next change number of swap $1 and reads the swap and its guild's verdict setting with it.
 * `swapColumns` is the swap's select list, built from the model's attributes (names, never values).
 * Numbered, for a named statement on the board fan-out's own pool.
 */
export const bumpVersion = (swapColumns: string) => `WITH bumped AS (
             INSERT INTO swap_versions (swap_id, version) VALUES ($1, 1)
             ON CONFLICT (swap_id) DO UPDATE SET version = swap_versions.version + 1 RETURNING version)
           SELECT bumped.version, g.verdicts_visible_to AS "verdictsVisibleTo", ${swapColumns}
             FROM bumped JOIN swaps "Swap" ON "Swap"."id" = $1 JOIN guilds g ON g.id = "Swap"."guild_id"`;

/** The current change number of swap $swapId; no row before its first change. */
export const BOARD_VERSION = 'SELECT version FROM swap_versions WHERE swap_id = $swapId';
