import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BlockDto } from '@shared/swap-types';
import { api } from '@/lib/api-client';
import { invalidateSwapData } from '@/entities/block/api/block-keys';

export const trimBlock = (blockId: number) => api.post<BlockDto>(`/blocks/${blockId}/trimmed`);

export function useTrimBlock(swapId: number) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: trimBlock, onSettled: () => invalidateSwapData(queryClient, swapId) });
}
