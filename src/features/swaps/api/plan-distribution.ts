import { useMutation } from '@tanstack/react-query';
import type { DistributionPlanDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';

/** Asks the server for a proposal; nothing is stored until it is confirmed. */
export const planDistribution = (swapId: number) => api.post<DistributionPlanDto>(`/swaps/${swapId}/distribution/plan`);

export function usePlanDistribution(swapId: number) {
  return useMutation({ mutationFn: () => planDistribution(swapId) });
}
