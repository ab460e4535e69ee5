import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ConfirmDistributionInput } from '@shared/schemas/swaps';
import type { DistributionResultDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { invalidateSwapData } from '@/entities/block/api/block-keys';
import { swapKeys } from '@/entities/swap/api/swap-keys';

export const confirmDistribution = (swapId: number, body: ConfirmDistributionInput) =>
  api.post<DistributionResultDto>(`/swaps/${swapId}/distribution/confirm`, body);

export function useConfirmDistribution(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ConfirmDistributionInput) => confirmDistribution(swapId, body),
    onSettled: () =>
      Promise.all([invalidateSwapData(queryClient, swapId), queryClient.invalidateQueries({ queryKey: swapKeys.lists() })]),
  });
}
