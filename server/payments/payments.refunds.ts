/**
 * Refunds through the payment service: when a swap is cancelled, when a member withdraws before sign-up
 * closes, and by hand from the treasurer's view. A payment stays `paid` (refund requested) until the
 * service's webhook says the refund went through.
 */
import type { AppDeps } from '../deps';
import type { GuildPaymentDto } from '@shared/schemas/payments';
import { ConflictError, NotFoundError } from '../http/errors';
import { callService, paymentsClient, paymentsEnabled } from './payments-client';
import * as q from './payments.queries';
import type { PaymentRow } from './payments.queries';
import { guildPayments } from './payments.service';

type Deps = Pick<AppDeps, 'pool' | 'config' | 'logger'>;

/**
 * Asks the service to refund one paid payment. The payment stays `paid` (refund requested) until the
 * service's webhook says the refund went through; a refusal is kept for the treasurer to see.
 */
export async function refundPayment(deps: Deps, payment: PaymentRow): Promise<void> {
  if (payment.status !== 'paid' || !payment.payment_intent_id)
    throw new ConflictError('Only a paid payment can be refunded.', 'not_refundable');
  const stripe = paymentsClient(deps.config);
  try {
    const refund = await callService(() =>
      stripe.refunds.create(
        { payment_intent: payment.payment_intent_id!, amount: payment.amount, metadata: { payment_id: String(payment.id) } },
        { idempotencyKey: `blockpost-refund-${payment.id}` },
      ),
    );
    await q.updatePayment(deps.pool, payment.id, { refund_id: refund.id, refund_requested_at: new Date(), refund_error: null });
  } catch (error) {
    const message = (error as Error).message.slice(0, 300);
    await q.updatePayment(deps.pool, payment.id, { refund_error: message });
    throw error;
  }
}

/** Refunds a swap's paid fees: everyone's when it is cancelled, one member's when they withdraw. */
export async function refundSwapFees(deps: Deps, swapId: number, userId: number | null): Promise<number> {
  if (!paymentsEnabled(deps.config)) return 0;
  let asked = 0;
  for (const payment of await q.paidForSwap(deps.pool, swapId, userId)) {
    try {
      await refundPayment(deps, payment);
      asked += 1;
    } catch (error) {
      deps.logger.warn({ err: error, paymentId: payment.id }, 'refund could not be asked for; the treasurer can retry it');
    }
  }
  return asked;
}

/** The treasurer refunds one payment by hand (or retries a refund the service refused). */
export async function refundById(deps: Deps, guildId: number, paymentId: number): Promise<GuildPaymentDto> {
  const payment = await q.paymentById(deps.pool, paymentId);
  if (!payment || payment.guild_id !== guildId) throw new NotFoundError('That payment does not exist.');
  if (payment.refund_requested_at && !payment.refund_error)
    throw new ConflictError('A refund of this payment is already on its way.', 'refund_requested');
  await refundPayment(deps, payment);
  const list = await guildPayments(deps, guildId, {});
  const row = list.payments.find((p) => p.id === paymentId);
  if (!row) throw new NotFoundError('That payment does not exist.');
  return row;
}
