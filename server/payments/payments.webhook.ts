/**
 * The payment service's webhook: the only way money is marked paid or refunded. Each event is
 * verified with the SDK against the signing secret (a forged body or an old, replayed signature is
 * refused with 400 and changes nothing), recorded by id once (a repeat is answered 200 and ignored),
 * and applied only as a step forward (pending → failed → paid → refunded), so events arriving out of
 * order never undo a later state.
 */
import type Stripe from 'stripe';
import type { PaymentStatus } from '@shared/schemas/payments';
import type { AppDeps } from '../deps';
import { withPgTransaction } from '../db/pg-transaction';
import { AppError, ValidationError } from '../http/errors';
import { paymentsClient } from './payments-client';
import * as q from './payments.queries';
import type { PaymentRow } from './payments.queries';

type Deps = Pick<AppDeps, 'pool' | 'config' | 'logger' | 'events'>;

const rank: Record<PaymentStatus, number> = { pending: 0, failed: 1, paid: 2, refunded: 3 };

/** No key and secret: there is no payments endpoint here (a 4xx, so a misdirected service stops retrying). */
class WebhookOffError extends AppError {
  constructor() {
    super(404, 'payments_off', 'Payments are not set up on this server, so it takes no payment events.');
  }
}

export interface WebhookResult {
  received: true;
  duplicate?: true;
  changed: number;
}

/** The payment ids our checkout put in the metadata ("12,13"). */
function idsFrom(metadata: Stripe.Metadata | null | undefined): number[] | undefined {
  const raw = metadata?.payment_ids ?? metadata?.payment_id;
  if (!raw) return undefined;
  const ids = raw
    .split(',')
    .map(Number)
    .filter((n) => Number.isInteger(n) && n > 0);
  return ids.length ? ids : undefined;
}

interface Change {
  to: PaymentStatus;
  reason?: string | null;
  intentId?: string | null;
  at?: Date;
}

/** What an event says about which payments, or null when it says nothing we track. */
function readEvent(event: Stripe.Event): { where: Parameters<typeof q.lockPayments>[1]; change: Change } | null {
  const at = new Date(event.created * 1000);
  switch (event.type) {
    case 'checkout.session.completed':
    case 'checkout.session.async_payment_succeeded': {
      const s = event.data.object;
      if (s.payment_status !== 'paid') return null;
      const intentId = typeof s.payment_intent === 'string' ? s.payment_intent : (s.payment_intent?.id ?? null);
      return { where: { sessionId: s.id }, change: { to: 'paid', intentId, reason: null, at } };
    }
    case 'checkout.session.async_payment_failed':
      return { where: { sessionId: event.data.object.id }, change: { to: 'failed', reason: 'The payment did not go through.' } };
    case 'checkout.session.expired':
      return {
        where: { sessionId: event.data.object.id },
        change: { to: 'failed', reason: 'The checkout closed before anything was paid.' },
      };
    case 'payment_intent.payment_failed': {
      const pi = event.data.object;
      const ids = idsFrom(pi.metadata);
      if (!ids) return null;
      return {
        where: { ids },
        change: {
          to: 'failed',
          intentId: pi.id,
          reason: (pi.last_payment_error?.message ?? 'The payment was declined.').slice(0, 300),
        },
      };
    }
    case 'refund.created':
    case 'refund.updated':
    case 'refund.failed': {
      const refund = event.data.object;
      const ids = idsFrom(refund.metadata);
      if (!ids) return null;
      if (refund.status === 'succeeded') return { where: { ids }, change: { to: 'refunded', at } };
      if (refund.status === 'failed' || refund.status === 'canceled') {
        return {
          where: { ids },
          change: { to: 'paid', reason: `The refund did not go through (${refund.failure_reason ?? refund.status}).` },
        };
      }
      return null;
    }
    default:
      return null;
  }
}

/** Verifies and applies one webhook delivery. */
export async function handlePaymentEvent(deps: Deps, rawBody: Buffer, signature: string | undefined): Promise<WebhookResult> {
  const secret = deps.config.STRIPE_WEBHOOK_SECRET;
  if (!secret || !deps.config.STRIPE_SECRET_KEY) throw new WebhookOffError();
  if (!signature) throw new ValidationError('This request carries no payment-service signature.');
  let event: Stripe.Event;
  try {
    event = paymentsClient(deps.config).webhooks.constructEvent(rawBody, signature, secret);
  } catch {
    throw new ValidationError('The payment-service signature does not match this request, or it is too old.');
  }

  const read = readEvent(event);
  // A delivery seen before writes nothing (its event row is already there) and changes nothing.
  const outcome = await withPgTransaction(deps.pool, async (client) => {
    if (!(await q.recordEvent(client, event.id, event.type))) return null;
    const settled: { rows: PaymentRow[]; to: PaymentStatus }[] = [];
    let changed = 0;
    if (read) {
      const rows = await q.lockPayments(client, read.where);
      const moved: PaymentRow[] = [];
      for (const row of rows) {
        const { to, reason, intentId, at } = read.change;
        if (to === 'paid' && row.status === 'paid') {
          // A refund the service refused: the payment stays paid, and the treasurer sees why.
          if (reason) await q.updatePayment(client, row.id, { refund_error: reason, refund_requested_at: null });
          continue;
        }
        if (rank[to] <= rank[row.status]) continue;
        await q.updatePayment(client, row.id, {
          status: to,
          status_reason: reason ?? null,
          ...(intentId ? { payment_intent_id: intentId } : {}),
          ...(to === 'paid' ? { paid_at: at ?? new Date() } : {}),
          ...(to === 'refunded' ? { refunded_at: at ?? new Date(), refund_error: null } : {}),
        });
        moved.push({ ...row, status: to });
      }
      changed = moved.length;
      if (moved.length) settled.push({ rows: moved, to: read.change.to });
    }
    return { settled, changed };
  });
  if (!outcome) return { received: true, duplicate: true, changed: 0 };
  const { settled, changed } = outcome;

  for (const { rows, to } of settled) {
    if (to === 'pending') continue;
    // One notice per person and swap (a checkout can carry an entry fee and postage together).
    const groups = new Map<string, PaymentRow[]>();
    for (const r of rows)
      groups.set(`${r.user_id}:${r.swap_id ?? 'dues'}`, [...(groups.get(`${r.user_id}:${r.swap_id ?? 'dues'}`) ?? []), r]);
    for (const group of groups.values()) {
      const first = group[0]!;
      deps.events.emit('payment.settled', {
        guildId: first.guild_id,
        userId: first.user_id,
        swapId: first.swap_id,
        paymentIds: group.map((r) => r.id),
        status: to,
      });
    }
  }
  deps.logger.info({ event: event.type, id: event.id, changed }, 'payment event');
  return { received: true, changed };
}
