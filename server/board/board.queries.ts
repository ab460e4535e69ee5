/** The board's hand-written SQL; every value arrives as a bind parameter. */

/**
 * The roster ($swapId): one row per active sign-up, sorted by name, carrying the member's blocks as a
 * JSON array: one query and one connection whatever the size of the swap, and JSON is quicker to
 * read than a row per block. The swap's blocks, their photos and their latest photo estimates are
 * each read once and joined, rather than looked up block by block (half the database's time).
 * by_maker is MATERIALIZED so it is computed once: before a new swap's rows have statistics the
 * planner would otherwise re-aggregate it for every member (seconds for 600 members).
 */
export const ROSTER = `WITH swap_blocks AS (SELECT * FROM blocks WHERE swap_id = $swapId),
       block_photos AS (
         SELECT p.block_id, array_agg(p.id ORDER BY p.created_at, p.id) AS ids
           FROM photos p JOIN swap_blocks b ON b.id = p.block_id GROUP BY p.block_id),
       latest AS (
         SELECT DISTINCT ON (e.block_id) e.id, e.block_id, e.verdict, e.width, e.height, e.expected_error, e.borderline, e.created_at
           FROM photo_estimates e JOIN swap_blocks b ON b.id = e.block_id
          ORDER BY e.block_id, e.created_at DESC, e.id DESC),
       by_maker AS MATERIALIZED (
         SELECT b.maker_id, json_agg(json_build_object(
                  'id', b.id, 'sequence', b.sequence, 'state', b.state, 'verdict', b.verdict, 'trimmed', b.trimmed,
                  'acceptedByDecision', b.accepted_at IS NOT NULL, 'handInHow', b.hand_in_how, 'handInNote', b.hand_in_note,
                  'photoIds', coalesce(p.ids, '{}'::int[]),
                  'estimate', CASE WHEN latest.id IS NULL THEN NULL ELSE row_to_json(latest) END
                ) ORDER BY b.sequence) AS own
           FROM swap_blocks b
           LEFT JOIN block_photos p ON p.block_id = b.id
           LEFT JOIN latest ON latest.block_id = b.id
          GROUP BY b.maker_id)
  SELECT s.user_id, u.display_name, u.email, s.blocks, u.mailing_address, coalesce(m.own, '[]') AS own
    FROM signups s JOIN users u ON u.id = s.user_id LEFT JOIN by_maker m ON m.maker_id = s.user_id
   WHERE s.swap_id = $swapId AND s.status = 'active'
   ORDER BY lower(u.display_name), u.id`;
