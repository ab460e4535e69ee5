/**
 * Dues and swap fees: what each member owes, hosted checkout for it, the lists a member and the
 * treasurer see, and refunds. Money is never marked paid here: only a verified webhook does that
 * (payments.webhook.ts). Amounts are integers in the guild currency's minor unit.
 */
import type Stripe from 'stripe';
import type { AppDeps } from '../deps';
import {
  paymentKindLabels,
  type FeeLine,
  type FeeStanding,
  type GuildDuesDto,
  type GuildPaymentDto,
  type GuildPaymentsDto,
  type GuildPaymentsQuery,
  type MyPaymentDto,
  type PaymentKind,
  type PaymentTotals,
  type SwapFeesDto,
} from '@shared/schemas/payments';
import { ConflictError, NotFoundError } from '../http/errors';
import { callService, paymentsClient, paymentsEnabled, paymentsTestMode } from './payments-client';
import * as q from './payments.queries';
import type { PaymentListRow, PaymentRow } from './payments.queries';

type Deps = Pick<AppDeps, 'pool' | 'config' | 'logger'>;

/** Where one fee stands for one person, from whether it is owed and that person's payments for it (newest first). */
export function standingOf(owed: boolean, rows: Pick<PaymentRow, 'status'>[]): FeeStanding {
  if (rows.some((r) => r.status === 'paid')) return 'paid';
  if (rows.some((r) => r.status === 'pending')) return 'pending';
  if (!owed) return rows[0]?.status === 'refunded' ? 'refunded' : 'not_owed';
  return rows[0]?.status === 'failed' ? 'failed' : 'owed';
}

/** Still to pay: owed and neither paid nor waiting on the service. */
const payable = (standing: FeeStanding) => standing === 'owed' || standing === 'failed';

function feeLines(
  fees: { entry: number; postage: number },
  who: { signed_up: boolean; by_post: boolean },
  rows: Pick<PaymentRow, 'kind' | 'status'>[],
): FeeLine[] {
  const lines: FeeLine[] = [];
  if (fees.entry > 0)
    lines.push({
      kind: 'entry',
      amount: fees.entry,
      standing: standingOf(
        who.signed_up,
        rows.filter((r) => r.kind === 'entry'),
      ),
    });
  if (fees.postage > 0) {
    lines.push({
      kind: 'postage',
      amount: fees.postage,
      standing: standingOf(
        who.signed_up && who.by_post,
        rows.filter((r) => r.kind === 'postage'),
      ),
    });
  }
  return lines;
}

/** A swap's fees and the caller's standing; officers also get every signed-up member's. */
export async function swapFees(deps: Deps, swapId: number, userId: number, canManage: boolean): Promise<SwapFeesDto> {
  const swap = await q.swapFeesFor(deps.pool, swapId, userId);
  if (!swap) throw new NotFoundError('That swap does not exist.');
  const fees = { entry: swap.entry_fee, postage: swap.postage_fee };
  const dto: SwapFeesDto = {
    swapId,
    currency: swap.currency,
    fees,
    enabled: paymentsEnabled(deps.config),
    testMode: paymentsTestMode(deps.config),
    mine: feeLines(fees, swap, swap.mine),
  };
  if (canManage && (fees.entry > 0 || fees.postage > 0)) {
    const [people, all] = await Promise.all([q.swapParticipants(deps.pool, swapId), q.paymentsForSwap(deps.pool, swapId)]);
    dto.members = people.map((p) => {
      const theirs = all.filter((r) => r.user_id === p.user_id);
      const lines = feeLines(fees, { signed_up: true, by_post: p.by_post }, theirs);
      const of = (kind: PaymentKind) => lines.find((l) => l.kind === kind)?.standing ?? 'not_owed';
      return { userId: p.user_id, displayName: p.display_name, entry: of('entry'), postage: of('postage') };
    });
  }
  return dto;
}

/** The guild's dues for its current year and the caller's standing; admins also get every member's. */
export async function guildDues(deps: Deps, guildId: number, userId: number, isAdmin: boolean): Promise<GuildDuesDto> {
  const guild = await q.guildDuesFor(deps.pool, guildId, userId);
  if (!guild) throw new NotFoundError('That guild does not exist.');
  const dues = guild.dues_amount && guild.dues_year ? { amount: guild.dues_amount, year: guild.dues_year } : null;
  const dto: GuildDuesDto = {
    guildId,
    currency: guild.currency,
    dues,
    enabled: paymentsEnabled(deps.config),
    testMode: paymentsTestMode(deps.config),
    mine: 'not_owed',
  };
  if (!dues) return dto;
  dto.mine = standingOf(true, guild.mine);
  if (isAdmin) {
    const [members, all] = await Promise.all([q.guildMembers(deps.pool, guildId), q.duesPayments(deps.pool, guildId, dues.year)]);
    dto.members = members.map((m) => ({
      userId: m.user_id,
      displayName: m.display_name,
      standing: standingOf(
        true,
        all.filter((r) => r.user_id === m.user_id),
      ),
    }));
  }
  return dto;
}

interface CheckoutLine {
  kind: PaymentKind;
  amount: number;
  label: string;
}

/**
 * Opens a hosted checkout for the given lines: records each as a pending payment, closes any earlier
 * checkout still open for the same things (so nobody pays twice), and returns the page's URL.
 */
async function openCheckout(
  deps: Deps,
  ctx: { guildId: number; userId: number; swapId: number | null; year: number | null; currency: string; backPath: string },
  lines: CheckoutLine[],
): Promise<{ url: string }> {
  const stripe = paymentsClient(deps.config);
  await closeEarlierCheckouts(
    deps,
    stripe,
    ctx,
    lines.map((l) => l.kind),
  );

  const rows: PaymentRow[] = [];
  for (const line of lines) {
    rows.push(
      await q.insertPayment(deps.pool, {
        guildId: ctx.guildId,
        userId: ctx.userId,
        swapId: ctx.swapId,
        kind: line.kind,
        year: ctx.year,
        amount: line.amount,
        currency: ctx.currency,
      }),
    );
  }
  const ids = rows.map((r) => r.id);
  const who = await q.userEmail(deps.pool, ctx.userId);
  const base = deps.config.PUBLIC_URL.replace(/\/$/, '');
  const back = encodeURIComponent(ctx.backPath);
  const meta = { payment_ids: ids.join(','), guild_id: String(ctx.guildId) };
  let session: Stripe.Checkout.Session;
  try {
    session = await callService(() =>
      stripe.checkout.sessions.create(
        {
          mode: 'payment',
          line_items: lines.map((l) => ({
            quantity: 1,
            price_data: { currency: ctx.currency, unit_amount: l.amount, product_data: { name: l.label } },
          })),
          success_url: `${base}/payments/return?session_id={CHECKOUT_SESSION_ID}&back=${back}`,
          cancel_url: `${base}/payments/return?cancelled=1&back=${back}`,
          client_reference_id: `user-${ctx.userId}`,
          ...(who ? { customer_email: who.email } : {}),
          metadata: meta,
          payment_intent_data: { metadata: meta },
        },
        { idempotencyKey: `blockpost-checkout-${ids.join('-')}` },
      ),
    );
  } catch (error) {
    await q.deletePayments(deps.pool, ids);
    throw error;
  }
  await q.setCheckoutSession(deps.pool, ids, session.id);
  if (!session.url) throw new ConflictError('The payment service opened no payment page. Please try again.', 'payment_service');
  return { url: session.url };
}

/** Before a new checkout: an earlier one still open is expired; one already paid stops us. */
async function closeEarlierCheckouts(
  deps: Deps,
  stripe: Stripe,
  ctx: { guildId: number; userId: number; swapId: number | null; year: number | null },
  kinds: PaymentKind[],
) {
  const earlier = await q.pendingLike(deps.pool, {
    userId: ctx.userId,
    kinds,
    swapId: ctx.swapId,
    guildId: ctx.guildId,
    year: ctx.year,
  });
  const sessions = new Set(earlier.map((r) => r.checkout_session_id).filter((s): s is string => Boolean(s)));
  for (const id of sessions) {
    const session = await callService(() => stripe.checkout.sessions.retrieve(id));
    if (session.status === 'complete') {
      throw new ConflictError(
        'Your earlier payment for this went through; we are waiting for the payment service to confirm it. Refresh this page in a minute.',
        'payment_in_flight',
      );
    }
    if (session.status === 'open') await callService(() => stripe.checkout.sessions.expire(id));
  }
  for (const row of earlier)
    await q.updatePayment(deps.pool, row.id, { status: 'failed', status_reason: 'Replaced by a newer checkout.' });
}

/** Checkout for the caller's unpaid swap fees (all of them, or the kinds asked for). */
export async function startSwapCheckout(
  deps: Deps,
  swapId: number,
  userId: number,
  kinds?: ('entry' | 'postage')[],
): Promise<{ url: string }> {
  const swap = await q.swapFeesFor(deps.pool, swapId, userId);
  if (!swap) throw new NotFoundError('That swap does not exist.');
  if (swap.state === 'cancelled' || swap.state === 'complete')
    throw new ConflictError(`This swap is ${swap.state}; it takes no more payments.`, 'swap_closed');
  const fees = { entry: swap.entry_fee, postage: swap.postage_fee };
  if (fees.entry === 0 && fees.postage === 0) throw new ConflictError('This swap has no fee to pay.', 'nothing_owed');
  if (!swap.signed_up)
    throw new ConflictError('Sign up for the swap first; its fees are for members who take part.', 'not_signed_up');
  const wanted = feeLines(fees, swap, swap.mine).filter(
    (l) => payable(l.standing) && (!kinds || kinds.includes(l.kind as 'entry' | 'postage')),
  );
  if (wanted.length === 0) {
    const postageAsked = kinds?.includes('postage') && fees.postage > 0 && !swap.by_post;
    throw new ConflictError(
      postageAsked
        ? 'Return postage is only for members who send their blocks by post; hand a block in by post first.'
        : 'Nothing is left to pay for this swap.',
      'nothing_owed',
    );
  }
  return openCheckout(
    deps,
    {
      guildId: swap.guild_id,
      userId,
      swapId,
      year: null,
      currency: swap.currency,
      backPath: `/guilds/${swap.guild_id}/swaps/${swapId}/fees`,
    },
    wanted.map((l) => ({ kind: l.kind, amount: l.amount, label: `${paymentKindLabels[l.kind]} — ${swap.title}` })),
  );
}

/** Checkout for this year's dues. */
export async function startDuesCheckout(deps: Deps, guildId: number, userId: number): Promise<{ url: string }> {
  const guild = await q.guildDuesFor(deps.pool, guildId, userId);
  if (!guild) throw new NotFoundError('That guild does not exist.');
  if (!guild.dues_amount || !guild.dues_year) throw new ConflictError('The guild asks for no dues right now.', 'nothing_owed');
  const standing = standingOf(true, guild.mine);
  if (!payable(standing))
    throw new ConflictError(
      `Your ${guild.dues_year} dues are already ${standing === 'paid' ? 'paid' : 'on their way'}.`,
      'nothing_owed',
    );
  return openCheckout(
    deps,
    { guildId, userId, swapId: null, year: guild.dues_year, currency: guild.currency, backPath: `/guilds/${guildId}/dues` },
    [{ kind: 'dues', amount: guild.dues_amount, label: `${paymentKindLabels.dues} ${guild.dues_year} — ${guild.name}` }],
  );
}

const iso = (d: Date | null) => (d ? d.toISOString() : null);

function myDto(r: PaymentListRow): MyPaymentDto {
  return {
    id: r.id,
    kind: r.kind,
    ...(r.swap_id ? { swapId: r.swap_id } : {}),
    amount: r.amount,
    currency: r.currency,
    status: r.status,
    guildId: r.guild_id,
    guildName: r.guild_name,
    ...(r.swap_title ? { swapTitle: r.swap_title } : {}),
    ...(r.dues_year ? { year: r.dues_year } : {}),
    createdAt: r.created_at.toISOString(),
    paidAt: iso(r.paid_at),
    refundedAt: iso(r.refunded_at),
    // A cancelled swap's fees are refunded just after the move, so the refund is due before it is asked.
    refundOnItsWay: r.status === 'paid' && !r.refund_error && (r.refund_requested_at !== null || r.swap_state === 'cancelled'),
  };
}

export async function myPayments(deps: Deps, userId: number, session?: string): Promise<MyPaymentDto[]> {
  return (await q.listForUser(deps.pool, userId, session ?? null)).map(myDto);
}

const emptyTotals = (): PaymentTotals => ({ paid: 0, refunded: 0, pending: 0, failed: 0, count: 0 });

function addTo(t: PaymentTotals, r: Pick<PaymentRow, 'status' | 'amount'>) {
  t[r.status] += r.amount;
  t.count += 1;
}

/** Every payment of the guild with the filters applied, and totals per swap and per year. */
export async function guildPayments(
  deps: Deps,
  guildId: number,
  filters: Omit<GuildPaymentsQuery, 'format'>,
): Promise<GuildPaymentsDto> {
  const guild = await q.guildSettings(deps.pool, guildId);
  if (!guild) throw new NotFoundError('That guild does not exist.');
  const rows = await q.listForGuild(deps.pool, guildId, filters);
  const all = emptyTotals();
  const bySwap = new Map<number, PaymentTotals & { swapId: number; title: string }>();
  const byYear = new Map<number, PaymentTotals & { year: number }>();
  for (const r of rows) {
    addTo(all, r);
    if (r.swap_id) {
      const t = bySwap.get(r.swap_id) ?? { ...emptyTotals(), swapId: r.swap_id, title: r.swap_title ?? '' };
      addTo(t, r);
      bySwap.set(r.swap_id, t);
    }
    const year = r.guild_year;
    const y = byYear.get(year) ?? { ...emptyTotals(), year };
    addTo(y, r);
    byYear.set(year, y);
  }
  const payments: GuildPaymentDto[] = rows.map((r) => ({
    ...myDto(r),
    userId: r.user_id,
    displayName: r.display_name,
    statusReason: r.status_reason,
    refundRequestedAt: iso(r.refund_requested_at),
    refundError: r.refund_error,
  }));
  return {
    guildName: guild.name,
    currency: guild.currency,
    payments,
    totals: {
      all,
      bySwap: [...bySwap.values()].sort((a, b) => b.swapId - a.swapId),
      byYear: [...byYear.values()].sort((a, b) => b.year - a.year),
    },
  };
}
