import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MyPaymentDto } from '@shared/schemas/payments';
import { api } from '@/lib/api-client';
import { paymentKeys } from '@/entities/payment/api/payment-keys';

export const getMyPayments = (session?: string) => api.get<MyPaymentDto[]>('/me/payments', { query: { session } });
export const myPaymentsQueryOptions = (session?: string) =>
  queryOptions({ queryKey: paymentKeys.mine(session), queryFn: () => getMyPayments(session) });

/** The caller's payments; with `pollWhilePending`, asks again every 2 s while any is still waiting on the service. */
export function useMyPayments(session?: string, pollWhilePending = false, enabled = true) {
  return useQuery({
    ...myPaymentsQueryOptions(session),
    enabled,
    refetchInterval: (query) => (pollWhilePending && (query.state.data ?? []).some((p) => p.status === 'pending') ? 2000 : false),
  });
}
