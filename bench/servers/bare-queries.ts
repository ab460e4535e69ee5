/** The bare references' SQL: the roster's rows flat (one per block) and a measurement row written. */

export const BARE_ROSTER_SQL = `SELECT s.user_id, u.display_name, s.blocks, b.id, b.sequence, b.state, b.verdict, b.trimmed, b.recipient_id
  FROM signups s JOIN users u ON u.id = s.user_id LEFT JOIN blocks b ON b.swap_id = s.swap_id AND b.maker_id = s.user_id
 WHERE s.swap_id = $1 AND s.status = 'active' ORDER BY lower(u.display_name), b.sequence`;

export const BARE_MEASURE_SQL = `INSERT INTO measurements (block_id, source, width, height, verdict, deviation_width, deviation_height, created_at, updated_at)
  VALUES ($1, 'ruler', $2, $3, 'true', 0, 0, now(), now()) RETURNING id`;
