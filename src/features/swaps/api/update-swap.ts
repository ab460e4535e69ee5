import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateSwapInput } from '@shared/schemas/swaps';
import type { SwapDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { swapKeys } from '@/entities/swap/api/swap-keys';

export const updateSwap = (swapId: number, body: UpdateSwapInput) => api.patch<SwapDto>(`/swaps/${swapId}`, body);

export function useUpdateSwap(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateSwapInput) => updateSwap(swapId, body),
    onSuccess: (swap) => {
      queryClient.setQueryData(swapKeys.detail(swapId), swap);
      return queryClient.invalidateQueries({ queryKey: swapKeys.lists() });
    },
  });
}
