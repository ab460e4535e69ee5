/**
 * Hand-written SQL of mail; every value arrives as a bind parameter: named (`$swapId`) through
 * Sequelize, numbered (`$1`) through the plain pool, which numbers its parameters.
 */

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

/** The payments $1 (an array of ids) with their guild, swap and payer, for a receipt; oldest first. */
export const PAYMENT_RECEIPT_ROWS = `SELECT p.id, p.kind, p.amount, p.currency, p.status, p.dues_year, p.guild_id, p.swap_id, p.user_id, p.paid_at, p.refunded_at,
            s.title AS swap_title, g.name AS guild_name, g.time_zone, u.email, u.display_name
       FROM payments p JOIN guilds g ON g.id = p.guild_id JOIN users u ON u.id = p.user_id LEFT JOIN swaps s ON s.id = p.swap_id
      WHERE p.id = ANY($1::int[]) ORDER BY p.id`;

/**
 * Records a message once: key $1, category $2, kind $3, guild $4, swap $5, user $6, address $7, subject $8,
 * text $9, html $10, status $11, its reason $12, written for $13 (now when null). Returns the new row's id,
 * nothing when the key was recorded before.
 */
export const INSERT_MESSAGE = `
  INSERT INTO mail_messages
    (idempotency_key, category, kind, guild_id, swap_id, user_id, to_address, subject, text_body, html_body, status, status_reason, written_for)
  VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, COALESCE($13::timestamptz, now()))
  ON CONFLICT (idempotency_key) DO NOTHING
  RETURNING id`;

/** Messages whose delivery was lost: queued untouched for $1 minutes, or claimed with the lease run out. */
export const STALLED_MESSAGES = `SELECT id, idempotency_key FROM mail_messages
      WHERE (status = 'queued' AND updated_at < now() - make_interval(mins => $1))
         OR (status = 'sending' AND locked_until < now())
      ORDER BY id LIMIT 500`;

/**
 * A return notice waits while the same person's receipt for that swap is still on its way, so
 * "your blocks arrived" always lands before "blocks coming your way": a row when message $1 must wait.
 */
export const RECEIPT_PENDING = `
  SELECT 1 FROM mail_messages d
    JOIN mail_messages r ON r.swap_id = d.swap_id AND r.user_id = d.user_id AND r.kind = 'receipt' AND r.status IN ('queued', 'sending')
   WHERE d.id = $1 AND d.kind = 'distribution' AND d.status = 'queued'
   LIMIT 1`;

/** Claims message $1 for sending with a lease of $2 minutes, if it is queued or its last claim ran out. */
export const CLAIM_MESSAGE = `UPDATE mail_messages
        SET status = 'sending', attempts = attempts + 1, locked_until = now() + make_interval(mins => $2), updated_at = now()
      WHERE id = $1 AND (status = 'queued' OR (status = 'sending' AND locked_until < now()))
      RETURNING id, category, user_id, to_address, subject, text_body, html_body, attempts, kind, swap_id, idempotency_key, written_for`;

/** Message $1's outcome: status $2, its reason $3, the provider's id $4 (kept when null); the claim ends. */
export const FINISH_MESSAGE = `UPDATE mail_messages
          SET status = $2::text, status_reason = $3, provider_message_id = COALESCE($4, provider_message_id),
              sent_at = CASE WHEN $2::text = 'sent' THEN now() ELSE sent_at END, locked_until = NULL, updated_at = now()
        WHERE id = $1`;

/** Message $1 written anew just before sending: subject $2, text $3, html $4. */
export const REWRITE_MESSAGE = `UPDATE mail_messages SET subject = $2, text_body = $3, html_body = $4, updated_at = now() WHERE id = $1`;
