import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { HandInManyInput } from '@shared/schemas/blocks';
import type { BlockDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { invalidateSwapData } from '@/entities/block/api/block-keys';

export const handInMany = (swapId: number, body: HandInManyInput) => api.post<BlockDto[]>(`/swaps/${swapId}/handed-in`, body);

export function useHandInMany(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: HandInManyInput) => handInMany(swapId, body),
    onSettled: () => invalidateSwapData(queryClient, swapId),
  });
}
