import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SwapFeesDto } from '@shared/schemas/payments';
import { api } from '@/lib/api-client';
import { paymentKeys } from './payment-keys';

export const getSwapFees = (swapId: number) => api.get<SwapFeesDto>(`/swaps/${swapId}/fees`);
export const swapFeesQueryOptions = (swapId: number) =>
  queryOptions({ queryKey: paymentKeys.swapFees(swapId), queryFn: () => getSwapFees(swapId) });

/**
 * A swap's fees and who has paid them (everyone's only for officers). `enabled: false` when the swap
 * asks no fee; `pollWhilePending` asks again every 2 s while the caller's payment awaits confirmation.
 */
export function useSwapFees(swapId: number, opts: { enabled?: boolean; pollWhilePending?: boolean } = {}) {
  return useQuery({
    ...swapFeesQueryOptions(swapId),
    enabled: opts.enabled ?? true,
    refetchInterval: (query) =>
      opts.pollWhilePending && query.state.data?.mine.some((l) => l.standing === 'pending') ? 2000 : false,
  });
}
