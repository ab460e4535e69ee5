/** Hand-written SQL of the mail composers; every value arrives as a bind parameter. */

/** Each active, still-member signer of swap $swapId (guild $guildId): their pledge, blocks handed in and still owed. */
export const DEBTS = `SELECT s.user_id, s.blocks AS pledged,
            count(b.id) FILTER (WHERE b.state NOT IN ('pledged', 'sewn')) AS handed_in,
            count(b.id) FILTER (WHERE b.state IN ('pledged', 'sewn')) AS owed
       FROM signups s
       JOIN memberships m ON m.user_id = s.user_id AND m.guild_id = $guildId AND m.status = 'active'
       LEFT JOIN blocks b ON b.swap_id = s.swap_id AND b.maker_id = s.user_id
      WHERE s.swap_id = $swapId AND s.status = 'active'
      GROUP BY s.user_id, s.blocks
      ORDER BY s.user_id`;

/** Per recipient of swap $swapId's return: how many returned blocks from each maker. */
export const RETURN_SHARES = `SELECT b.recipient_id, u.display_name AS maker, count(*) AS count
       FROM blocks b JOIN users u ON u.id = b.maker_id
      WHERE b.swap_id = $swapId AND b.state = 'returned' AND b.recipient_id IS NOT NULL
      GROUP BY b.recipient_id, u.display_name
      ORDER BY b.recipient_id, u.display_name`;

/** Makers with a block of swap $swapId taken in (received, measured or returned). */
export const MAKERS_TAKEN_IN = `SELECT DISTINCT maker_id FROM blocks WHERE swap_id = $swapId AND state IN ('received', 'measured', 'returned') ORDER BY maker_id`;

/** Swap $swapId's moves between states from $from until $to, oldest first (its creation left out). */
export const WEEK_TRANSITIONS = `SELECT from_state, to_state, at FROM swap_transitions
        WHERE swap_id = $swapId AND from_state IS NOT NULL AND at >= $from AND at < $to ORDER BY at`;

/** Swap $swapId's sign-ups from $from until $to: joined, blocks they pledged, and withdrawn. */
export const WEEK_SIGNUPS = `SELECT count(*) FILTER (WHERE status = 'active' AND created_at >= $from AND created_at < $to) AS joined,
              coalesce(sum(blocks) FILTER (WHERE status = 'active' AND created_at >= $from AND created_at < $to), 0) AS joined_blocks,
              count(*) FILTER (WHERE status = 'withdrawn' AND updated_at >= $from AND updated_at < $to) AS withdrawn
         FROM signups WHERE swap_id = $swapId`;

/** Swap $swapId's blocks sewn, handed in, received and returned from $from until $to. */
export const WEEK_BLOCKS = `SELECT count(*) FILTER (WHERE sewn_at >= $from AND sewn_at < $to) AS sewn,
              count(*) FILTER (WHERE handed_in_at >= $from AND handed_in_at < $to) AS handed_in,
              count(*) FILTER (WHERE received_at >= $from AND received_at < $to) AS received,
              count(*) FILTER (WHERE returned_at >= $from AND returned_at < $to) AS returned
         FROM blocks WHERE swap_id = $swapId`;

/** Swap $swapId's blocks measured from $from until $to, counted by verdict. */
export const WEEK_VERDICTS = `SELECT verdict, count(*) AS count FROM blocks
        WHERE swap_id = $swapId AND verdict IS NOT NULL AND measured_at >= $from AND measured_at < $to GROUP BY verdict`;

/** Where swap $swapId stands: blocks pledged and by how many makers, handed in, measured, still owed and by how many. */
export const SWAP_TOTALS = `SELECT (SELECT coalesce(sum(blocks), 0) FROM signups WHERE swap_id = $swapId AND status = 'active') AS pledged,
              (SELECT count(*) FROM signups WHERE swap_id = $swapId AND status = 'active') AS makers,
              count(*) FILTER (WHERE state NOT IN ('pledged', 'sewn')) AS handed_in,
              count(*) FILTER (WHERE verdict IS NOT NULL) AS measured,
              count(*) FILTER (WHERE state IN ('pledged', 'sewn')) AS owed,
              count(DISTINCT maker_id) FILTER (WHERE state IN ('pledged', 'sewn')) AS owing
         FROM blocks WHERE swap_id = $swapId`;
