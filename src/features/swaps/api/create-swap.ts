import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateSwapInput } from '@shared/schemas/swaps';
import type { SwapDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { swapKeys } from '@/entities/swap/api/swap-keys';

export const createSwap = (guildId: number, body: CreateSwapInput) => api.post<SwapDto>(`/guilds/${guildId}/swaps`, body);

export function useCreateSwap(guildId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateSwapInput) => createSwap(guildId, body),
    onSuccess: (swap) => {
      queryClient.setQueryData(swapKeys.detail(swap.id), swap);
      return queryClient.invalidateQueries({ queryKey: swapKeys.list(guildId) });
    },
  });
}
