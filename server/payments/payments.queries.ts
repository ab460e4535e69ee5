/** The SQL of the payments slice; bind parameters only. */
import type pg from 'pg';
import type { PaymentKind, PaymentStatus } from '@shared/schemas/payments';

type Db = Pick<pg.Pool | pg.PoolClient, 'query'>;

export interface PaymentRow {
  id: number;
  guild_id: number;
  user_id: number;
  swap_id: number | null;
  kind: PaymentKind;
  dues_year: number | null;
  amount: number;
  currency: string;
  status: PaymentStatus;
  status_reason: string | null;
  checkout_session_id: string | null;
  payment_intent_id: string | null;
  refund_id: string | null;
  refund_requested_at: Date | null;
  refund_error: string | null;
  paid_at: Date | null;
  refunded_at: Date | null;
  created_at: Date;
}

export interface PaymentListRow extends PaymentRow {
  guild_name: string;
  swap_title: string | null;
  swap_state: string | null;
  display_name: string;
}

export interface SwapFeeRow {
  id: number;
  guild_id: number;
  title: string;
  state: string;
  signup_closes_at: Date;
  entry_fee: number;
  postage_fee: number;
  currency: string;
}

/** A swap's fees with where one person stands on them: signed up, sending by post, their payments' kinds and states. */
export interface SwapFeesForRow extends SwapFeeRow {
  signed_up: boolean;
  by_post: boolean;
  /** the person's payments for the swap, newest first */
  mine: Pick<PaymentRow, 'kind' | 'status'>[];
}

/** Swap $1's fees and where person $2 stands on them, in one named statement (a member's fees tab and checkout). */
export async function swapFeesFor(db: Db, swapId: number, userId: number): Promise<SwapFeesForRow | null> {
  const { rows } = await db.query<SwapFeesForRow>({
    name: 'swap_fees_for',
    text: `SELECT s.id, s.guild_id, s.title, s.state, s.signup_closes_at, s.entry_fee, s.postage_fee, g.currency,
              EXISTS (SELECT 1 FROM signups WHERE swap_id = s.id AND user_id = $2 AND status = 'active') AS signed_up,
              EXISTS (SELECT 1 FROM blocks WHERE swap_id = s.id AND maker_id = $2 AND hand_in_how = 'post') AS by_post,
              (SELECT coalesce(json_agg(json_build_object('kind', p.kind, 'status', p.status) ORDER BY p.created_at DESC, p.id DESC), '[]')
                 FROM payments p WHERE p.swap_id = s.id AND p.user_id = $2) AS mine
         FROM swaps s JOIN guilds g ON g.id = s.guild_id WHERE s.id = $1`,
    values: [swapId, userId],
  });
  return rows[0] ?? null;
}

export interface GuildPaymentSettingsRow {
  id: number;
  name: string;
  currency: string;
  dues_amount: number | null;
  dues_year: number | null;
}

export async function guildSettings(db: Db, guildId: number): Promise<GuildPaymentSettingsRow | null> {
  const { rows } = await db.query<GuildPaymentSettingsRow>(
    'SELECT id, name, currency, dues_amount, dues_year FROM guilds WHERE id = $1',
    [guildId],
  );
  return rows[0] ?? null;
}

/** The guild's dues settings with one person's payments of this year's dues (their states, newest first). */
export interface GuildDuesForRow extends GuildPaymentSettingsRow {
  mine: Pick<PaymentRow, 'status'>[];
}

/** Guild $1's dues and person $2's payments of them, in one named statement (a member's dues page and checkout). */
export async function guildDuesFor(db: Db, guildId: number, userId: number): Promise<GuildDuesForRow | null> {
  const { rows } = await db.query<GuildDuesForRow>({
    name: 'guild_dues_for',
    text: `SELECT g.id, g.name, g.currency, g.dues_amount, g.dues_year,
              (SELECT coalesce(json_agg(json_build_object('status', p.status) ORDER BY p.created_at DESC, p.id DESC), '[]')
                 FROM payments p
                WHERE p.guild_id = g.id AND p.kind = 'dues' AND p.dues_year = g.dues_year AND p.user_id = $2) AS mine
         FROM guilds g WHERE g.id = $1`,
    values: [guildId, userId],
  });
  return rows[0] ?? null;
}

/** Everyone's payments for a swap, newest first. */
export async function paymentsForSwap(db: Db, swapId: number): Promise<PaymentRow[]> {
  const { rows } = await db.query<PaymentRow>(`SELECT * FROM payments WHERE swap_id = $1 ORDER BY created_at DESC, id DESC`, [
    swapId,
  ]);
  return rows;
}

/** Everyone's payments of a year's dues, newest first. */
export async function duesPayments(db: Db, guildId: number, year: number): Promise<PaymentRow[]> {
  const { rows } = await db.query<PaymentRow>(
    `SELECT * FROM payments WHERE guild_id = $1 AND kind = 'dues' AND dues_year = $2 ORDER BY created_at DESC, id DESC`,
    [guildId, year],
  );
  return rows;
}

/** Members signed up for a swap (active sign-ups), with whether any of their blocks went by post. */
export async function swapParticipants(
  db: Db,
  swapId: number,
): Promise<{ user_id: number; display_name: string; by_post: boolean }[]> {
  const { rows } = await db.query<{ user_id: number; display_name: string; by_post: boolean }>(
    `SELECT su.user_id, u.display_name,
            EXISTS (SELECT 1 FROM blocks b WHERE b.swap_id = su.swap_id AND b.maker_id = su.user_id AND b.hand_in_how = 'post') AS by_post
       FROM signups su JOIN users u ON u.id = su.user_id
      WHERE su.swap_id = $1 AND su.status = 'active'
      ORDER BY u.display_name, su.user_id`,
    [swapId],
  );
  return rows;
}

export async function guildMembers(db: Db, guildId: number): Promise<{ user_id: number; display_name: string }[]> {
  const { rows } = await db.query<{ user_id: number; display_name: string }>(
    `SELECT m.user_id, u.display_name FROM memberships m JOIN users u ON u.id = m.user_id
      WHERE m.guild_id = $1 AND m.status = 'active' ORDER BY u.display_name, m.user_id`,
    [guildId],
  );
  return rows;
}

export async function insertPayment(
  db: Db,
  p: {
    guildId: number;
    userId: number;
    swapId: number | null;
    kind: PaymentKind;
    year: number | null;
    amount: number;
    currency: string;
  },
): Promise<PaymentRow> {
  const { rows } = await db.query<PaymentRow>(
    `INSERT INTO payments (guild_id, user_id, swap_id, kind, dues_year, amount, currency)
     VALUES ($1, $2, $3, $4, $5, $6, $7) RETURNING *`,
    [p.guildId, p.userId, p.swapId, p.kind, p.year, p.amount, p.currency],
  );
  return rows[0]!;
}

export async function setCheckoutSession(db: Db, ids: number[], sessionId: string) {
  await db.query('UPDATE payments SET checkout_session_id = $2, updated_at = now() WHERE id = ANY($1::int[])', [ids, sessionId]);
}

export async function deletePayments(db: Db, ids: number[]) {
  await db.query(`DELETE FROM payments WHERE id = ANY($1::int[]) AND status = 'pending' AND checkout_session_id IS NULL`, [ids]);
}

/** Pending payments of the same person for the same thing, whose checkout should be closed first. */
export async function pendingLike(
  db: Db,
  p: { userId: number; kinds: PaymentKind[]; swapId: number | null; guildId: number; year: number | null },
) {
  const { rows } = await db.query<PaymentRow>(
    `SELECT * FROM payments
      WHERE user_id = $1 AND kind = ANY($2::text[]) AND status = 'pending' AND guild_id = $3
        AND ($4::int IS NULL OR swap_id = $4) AND ($5::int IS NULL OR dues_year = $5)`,
    [p.userId, p.kinds, p.guildId, p.swapId, p.year],
  );
  return rows;
}

/** Records an event id; false when it was seen before (a repeat changes nothing). */
export async function recordEvent(db: Db, eventId: string, type: string): Promise<boolean> {
  const { rowCount } = await db.query(
    'INSERT INTO payment_events (event_id, type) VALUES ($1, $2) ON CONFLICT (event_id) DO NOTHING',
    [eventId, type],
  );
  return rowCount === 1;
}

export async function lockPayments(
  db: Db,
  where: { ids?: number[]; sessionId?: string; intentId?: string },
): Promise<PaymentRow[]> {
  const { rows } = await db.query<PaymentRow>(
    `SELECT * FROM payments
      WHERE ($1::int[] IS NOT NULL AND id = ANY($1::int[]))
         OR ($2::text IS NOT NULL AND checkout_session_id = $2)
         OR ($3::text IS NOT NULL AND payment_intent_id = $3)
      ORDER BY id FOR UPDATE`,
    [where.ids ?? null, where.sessionId ?? null, where.intentId ?? null],
  );
  return rows;
}

export async function updatePayment(
  db: Db,
  id: number,
  patch: Partial<
    Pick<
      PaymentRow,
      | 'status'
      | 'status_reason'
      | 'payment_intent_id'
      | 'refund_id'
      | 'refund_error'
      | 'paid_at'
      | 'refunded_at'
      | 'refund_requested_at'
    >
  >,
) {
  const columns = Object.keys(patch) as (keyof typeof patch)[];
  if (columns.length === 0) return;
  // Column names come from the fixed key list above, never from input.
  const sets = columns.map((c, i) => `${c} = $${i + 2}`).join(', ');
  await db.query(`UPDATE payments SET ${sets}, updated_at = now() WHERE id = $1`, [id, ...columns.map((c) => patch[c] ?? null)]);
}

const LIST_COLUMNS = 'p.*, g.name AS guild_name, s.title AS swap_title, s.state AS swap_state, u.display_name';
const LIST_FROM = `
    FROM payments p
    JOIN guilds g ON g.id = p.guild_id
    JOIN users u ON u.id = p.user_id
    LEFT JOIN swaps s ON s.id = p.swap_id`;
const LIST = `SELECT ${LIST_COLUMNS}${LIST_FROM}`;

export async function listForUser(db: Db, userId: number, sessionId: string | null): Promise<PaymentListRow[]> {
  const { rows } = await db.query<PaymentListRow>({
    name: 'payments_of_user',
    text: `${LIST} WHERE p.user_id = $1 AND ($2::text IS NULL OR p.checkout_session_id = $2) ORDER BY p.created_at DESC, p.id DESC LIMIT 500`,
    values: [userId, sessionId],
  });
  return rows;
}

export interface GuildPaymentListRow extends PaymentListRow {
  /** the membership year of dues, else the year on the guild's calendar when the payment was made */
  guild_year: number;
}

/**
 * The year a payment counts in for the treasurer: dues in their membership year, anything else in the
 * year of its creation on the guild's own calendar (a payment at 00:30 UTC on 1 January is still
 * 31 December in Chicago).
 */
const GUILD_YEAR = 'COALESCE(p.dues_year, EXTRACT(YEAR FROM p.created_at AT TIME ZONE g.time_zone)::int)';

export async function listForGuild(
  db: Db,
  guildId: number,
  f: { status?: PaymentStatus; kind?: PaymentKind; swapId?: number; year?: number },
): Promise<GuildPaymentListRow[]> {
  const { rows } = await db.query<GuildPaymentListRow>(
    `SELECT ${LIST_COLUMNS}, ${GUILD_YEAR} AS guild_year${LIST_FROM}
      WHERE p.guild_id = $1
        AND ($2::text IS NULL OR p.status = $2)
        AND ($3::text IS NULL OR p.kind = $3)
        AND ($4::int IS NULL OR p.swap_id = $4)
        AND ($5::int IS NULL OR ${GUILD_YEAR} = $5)
      ORDER BY p.created_at DESC, p.id DESC
      LIMIT 5000`,
    [guildId, f.status ?? null, f.kind ?? null, f.swapId ?? null, f.year ?? null],
  );
  return rows;
}

export async function paidForSwap(db: Db, swapId: number, userId: number | null): Promise<PaymentRow[]> {
  const { rows } = await db.query<PaymentRow>(
    `SELECT * FROM payments WHERE swap_id = $1 AND status = 'paid' AND refund_requested_at IS NULL AND ($2::int IS NULL OR user_id = $2) ORDER BY id`,
    [swapId, userId],
  );
  return rows;
}

export async function paymentById(db: Db, id: number): Promise<PaymentRow | null> {
  const { rows } = await db.query<PaymentRow>('SELECT * FROM payments WHERE id = $1', [id]);
  return rows[0] ?? null;
}

export async function userEmail(db: Db, userId: number): Promise<{ email: string; display_name: string } | null> {
  const { rows } = await db.query<{ email: string; display_name: string }>(
    'SELECT email, display_name FROM users WHERE id = $1',
    [userId],
  );
  return rows[0] ?? null;
}
