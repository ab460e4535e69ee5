/** The board's hand-written SQL; every value arrives as a bind parameter. */

/**
 * The roster ($swapId): one row per active sign-up, sorted by name, carrying the member's blocks as a JSON array: one query
 * and one connection whatever the size of the swap, and JSON is quicker to read than a row per block.
 */
export const ROSTER = `SELECT s.user_id, u.display_name, u.email, s.blocks, u.mailing_address,
         coalesce((
           SELECT json_agg(json_build_object(
                    'id', b.id, 'sequence', b.sequence, 'state', b.state, 'verdict', b.verdict, 'trimmed', b.trimmed,
                    'recipientId', b.recipient_id, 'handInHow', b.hand_in_how, 'handInNote', b.hand_in_note,
                    'photoIds', ARRAY(SELECT p.id FROM photos p WHERE p.block_id = b.id ORDER BY p.created_at, p.id),
                    'estimate', (SELECT row_to_json(latest) FROM (
                                   SELECT e.id, e.block_id, e.verdict, e.width, e.height, e.expected_error, e.borderline, e.created_at
                                     FROM photo_estimates e WHERE e.block_id = b.id
                                    ORDER BY e.created_at DESC, e.id DESC LIMIT 1) latest)
                  ) ORDER BY b.sequence)
             FROM blocks b WHERE b.swap_id = s.swap_id AND b.maker_id = s.user_id), '[]') AS own
    FROM signups s JOIN users u ON u.id = s.user_id
   WHERE s.swap_id = $swapId AND s.status = 'active'
   ORDER BY lower(u.display_name), u.id`;
