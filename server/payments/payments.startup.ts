/**
 * Refunds follow the swap: when a swap is cancelled every paid fee is refunded, and when a member
 * withdraws (only possible before sign-up closes) theirs is. Runs on every node; the SDK call carries
 * an idempotency key per payment, so two nodes asking for the same refund make one.
 */
import type { AppDeps } from '../deps';
import type { FeatureStartup } from '../features';
import { refundSwapFees } from './payments.refunds';

export function subscribePaymentRefunds(deps: Pick<AppDeps, 'events' | 'pool' | 'config' | 'logger'>) {
  deps.events.on('swap.transitioned', async (e) => {
    if (e.to === 'cancelled') await refundSwapFees(deps, e.swapId, null);
  });
  deps.events.on('signup.withdrawn', async (e) => {
    await refundSwapFees(deps, e.swapId, e.userId);
  });
}

export const paymentsFeature: FeatureStartup = async ({ deps }) => {
  subscribePaymentRefunds(deps);
  return { name: 'payments', close: async () => undefined };
};
