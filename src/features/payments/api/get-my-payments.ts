import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MyPaymentDto } from '@shared/schemas/payments';
import { api } from '@/lib/api-client';
import { paymentKeys } from '@/entities/payment/api/payment-keys';

export const getMyPayments = (session?: string) => api.get<MyPaymentDto[]>('/me/payments', { query: { session } });
export const myPaymentsQueryOptions = (session?: string) =>
  queryOptions({ queryKey: paymentKeys.mine(session), queryFn: () => getMyPayments(session) });

/** Whether the payment still waits on the service: a payment not yet through, or a refund on its way. */
const waiting = (p: MyPaymentDto) => p.status === 'pending' || p.refundOnItsWay;

/** The caller's payments; with `pollWhilePending`, asks again every 2 s while any still waits on the service. */
export function useMyPayments(session?: string, pollWhilePending = false, enabled = true) {
  return useQuery({
    ...myPaymentsQueryOptions(session),
    enabled,
    refetchInterval: (query) => (pollWhilePending && (query.state.data ?? []).some(waiting) ? 2000 : false),
  });
}
