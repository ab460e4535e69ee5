import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TransitionInput } from '@shared/schemas/swaps';
import type { SwapDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { swapKeys } from '@/entities/swap/api/swap-keys';

export const transitionSwap = (swapId: number, body: TransitionInput) => api.post<SwapDto>(`/swaps/${swapId}/transitions`, body);

export function useTransitionSwap(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: TransitionInput) => transitionSwap(swapId, body),
    onSuccess: (swap) => {
      queryClient.setQueryData(swapKeys.detail(swapId), swap);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: swapKeys.detail(swapId) }),
        queryClient.invalidateQueries({ queryKey: swapKeys.lists() }),
      ]);
    },
  });
}
